import { Injectable } from '@nestjs/common';
import type { CardSetDto } from '@crankjournal/shared-types';
import { CardSetsService } from '../indicator-cards/card-sets.service.js';
import type { Mill } from './mill.entity.js';

export interface IndicatedPowerFigure {
  indicatedHp: number;
  /** where the figure came from, shown beside every pass */
  source: string;
}

/**
 * The engine's recent indicated horsepower for the flywheel check of a logged pass. The one place that decides
 * it: the total indicated hp of the run's latest card set taken at or before the pass; where the run has none
 * yet, the mill's site setting "default indicated hp".
 */
/** Card sets of a run are read at most this often while passes are logged in quick succession. */
const CACHE_MS = 5_000;

@Injectable()
export class MillIndicatedPowerSource {
  private readonly cache = new Map<string, { at: number; sets: Promise<CardSetDto[]> }>();

  constructor(private readonly cardSets: CardSetsService) {}

  private setsOf(runId: string): Promise<CardSetDto[]> {
    const hit = this.cache.get(runId);
    if (hit && Date.now() - hit.at < CACHE_MS) return hit.sets;
    const sets = this.cardSets.list(runId);
    this.cache.set(runId, { at: Date.now(), sets });
    sets.catch(() => this.cache.delete(runId));
    for (const [k, v] of this.cache) if (Date.now() - v.at >= CACHE_MS) this.cache.delete(k);
    return sets;
  }

  async forRun(runId: string, mill: Mill, at: Date): Promise<IndicatedPowerFigure> {
    const sets = await this.setsOf(runId);
    const before = sets
      .filter((s) => new Date(s.takenAt).getTime() <= at.getTime() && s.results.totalIndicatedHorsepower > 0)
      .sort((a, b) => a.takenAt.localeCompare(b.takenAt));
    const latest = before[before.length - 1];
    if (latest) {
      return {
        indicatedHp: latest.results.totalIndicatedHorsepower,
        source: `card set of ${latest.takenAt.slice(11, 16)} UTC${latest.results.complete ? '' : ' (not every cylinder end carded)'}`,
      };
    }
    return {
      indicatedHp: mill.settings.defaultIndicatedHp,
      source: `site setting: default indicated hp of ${mill.name} (no card set of this run before the pass)`,
    };
  }
}
