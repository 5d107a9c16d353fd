// Benchmark 6: the automatic card tracer (shared-types' proposeCardTrace) on the test set of
// generated card photos (service/src/database/seeds/autotrace-cards.ts: five outlines under five
// photographic conditions) and the demo's card images (samples/cards). Measured: milliseconds per
// card from pixels to proposal, median and p99 over every card, each card traced REPEAT times, and the
// MEP error against the drawn outline. Runs in-process on the built packages; no service needed.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { createRequire } from 'node:module';
import { ROOT, log, round, stats, writeResult } from './lib.mjs';

const REPEAT = Number(process.env.B6_REPEAT ?? 3);
const dist = join(ROOT, 'service', 'dist');
const { drawTestCard, testCardSpecs } = await import(join(dist, 'database/seeds/autotrace-cards.js'));
const { autotraceCard } = await import(join(dist, 'calculations/indicator-autotrace.js'));
const { proposeCardTrace } = await import('@crankjournal/shared-types');
const { PNG } = createRequire(join(ROOT, 'service', 'package.json'))('pngjs');

const cards = testCardSpecs().map((spec) => {
  const c = drawTestCard(spec);
  return { name: spec.name, image: { data: c.data, width: c.width, height: c.height }, scale: spec, truth: c.meanEffectivePressurePsi };
});
const traces = JSON.parse(readFileSync(join(ROOT, 'samples', 'cards', 'traces.json'), 'utf8'));
for (const [name, t] of Object.entries(traces)) {
  const png = PNG.sync.read(readFileSync(join(ROOT, 'samples', 'cards', `${name}.png`)));
  cards.push({ name, image: { data: png.data, width: png.width, height: png.height }, scale: t, truth: null });
}

const times = [];
const errors = [];
for (const card of cards) {
  for (let i = 0; i < REPEAT; i++) {
    const t0 = performance.now();
    proposeCardTrace(card.image);
    times.push(performance.now() - t0);
  }
  if (card.truth) {
    const r = autotraceCard(card.image, { lengthIn: card.scale.lengthIn, springPsiPerIn: card.scale.springPsiPerIn });
    errors.push(r.meanEffectivePressurePsi === null ? null : Math.abs(r.meanEffectivePressurePsi / card.truth - 1) * 100);
  }
}
const s = stats(times);
const found = errors.filter((e) => e !== null);
const result = {
  cards: cards.length,
  repeat: REPEAT,
  msPerCard: { median: round(s.median, 0), p99: round(s.p99, 0), max: round(s.max, 0) },
  mepErrorPercent: {
    mean: round(found.reduce((a, b) => a + b, 0) / found.length, 2),
    max: round(Math.max(...found), 2),
    refused: errors.length - found.length,
  },
  met: { underOneSecond: s.p99 < 1000 },
};
const { median, p99 } = result.msPerCard;
log(`b6: ${cards.length} cards × ${REPEAT}: median ${median} ms, p99 ${p99} ms; MEP error mean ${result.mepErrorPercent.mean} %`);
writeResult('b6', result);
