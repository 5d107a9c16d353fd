/**
 * Writes the demo's card images into samples/cards/ (one PNG per traced card of
 * samples/indicator-cards.json) and the trace made on each into samples/cards/traces.json.
 * Run after a build: node dist/database/seeds/draw-cards.js
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { drawIndicatorCard } from './card-image.js';
import { readCardSamples, sampleCards } from './indicator-card-samples.js';
import { SAMPLES_DIR } from './samples.js';

function main() {
  const samples = readCardSamples();
  const dir = join(SAMPLES_DIR, 'cards');
  mkdirSync(dir, { recursive: true });
  const traces: Record<string, unknown> = {};
  let n = 0;
  for (const set of samples.sets.filter((s) => s.method === 'trace')) {
    for (const card of sampleCards(samples, set)) {
      const drawn = drawIndicatorCard(card.drawing);
      writeFileSync(join(dir, `${card.name}.png`), drawn.png);
      traces[card.name] = {
        run: set.run,
        minutes: set.minutes,
        cylinder: card.cylinder,
        end: card.end,
        springPsiPerIn: card.springPsiPerIn,
        lengthIn: card.lengthIn,
        widthPx: drawn.widthPx,
        heightPx: drawn.heightPx,
        trace: drawn.trace,
      };
      n++;
    }
  }
  writeFileSync(join(dir, 'traces.json'), `${JSON.stringify(traces, null, 1)}\n`);
  console.log(`cards: ${n} images and their traces written to ${dir}`);
}
main();
