import { Injectable, Logger } from '@nestjs/common';
import type { RunSummary } from '@crankjournal/shared-types';
import { CardSetsService } from '../indicator-cards/card-sets.service.js';

/** Card-set lookups in flight at once (the card-set service answers one run at a time). */
const CONCURRENCY = 8;
/** A closed run with no card sets is asked again after this long (its sets could only come from a re-seed). */
const NONE_TTL_MS = 10 * 60_000;

/**
 * Indicated power of each run, from the indicator-card area's card sets: the mean total IHP of the run's
 * complete sets. The card-set service answers per run, so runs are asked a few at a time; a closed run's card
 * sets can no longer change, so its figure is remembered.
 */
@Injectable()
export class MaintenanceIndicatedPowerSource {
  private readonly logger = new Logger('Maintenance');
  private readonly closed = new Map<string, { hp: number | null; at: number }>();
  constructor(private readonly cardSets: CardSetsService) {}

  async meanIndicatedHpByRun(runs: Pick<RunSummary, 'id' | 'state'>[]): Promise<Map<string, number>> {
    const out = new Map<string, number>();
    const now = Date.now();
    const ask: Pick<RunSummary, 'id' | 'state'>[] = [];
    for (const r of runs) {
      const memo = r.state === 'closed' ? this.closed.get(r.id) : undefined;
      if (memo && (memo.hp !== null || now - memo.at < NONE_TTL_MS)) {
        if (memo.hp !== null) out.set(r.id, memo.hp);
      } else ask.push(r);
    }
    let next = 0;
    const worker = async () => {
      while (next < ask.length) {
        const run = ask[next++];
        try {
          const sets = await this.cardSets.list(run.id);
          const hp = sets
            .filter(
              (s) => s.results?.complete && Number.isFinite(s.results.totalIndicatedHorsepower) && s.results.totalIndicatedHorsepower > 0,
            )
            .map((s) => s.results.totalIndicatedHorsepower);
          const mean = hp.length ? hp.reduce((a, b) => a + b, 0) / hp.length : null;
          if (mean !== null) out.set(run.id, mean);
          if (run.state === 'closed') this.closed.set(run.id, { hp: mean, at: now });
        } catch (e) {
          this.logger.warn(`indicated power of run ${run.id} not available: ${(e as Error).message}`);
        }
      }
    };
    await Promise.all(Array.from({ length: Math.min(CONCURRENCY, ask.length) }, worker));
    return out;
  }
}
