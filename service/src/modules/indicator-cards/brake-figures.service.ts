import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository, In, type EntityManager } from 'typeorm';
import type { BrakeFigureDto, BrakeFigureInput } from '@crankjournal/shared-types';
import { UsersService } from '../users/users.service.js';
import {
  CalculationInputError,
  brakeHorsepower,
  brakeTorqueLbfFt,
  ropeBrakeEffectiveRadiusFt,
} from '../../calculations/indicated-power.js';
import { hpToKw } from '../../calculations/units.js';
import { CardRecordAmendment } from './card-record-amendment.entity.js';
import { amendmentsBySubject } from './card-set-amendments.js';
import { BrakeFigure } from './brake-figure.entity.js';

/** A brake figure is compared with card sets taken no further than this from it. */
export const BRAKE_FIGURE_WINDOW_MS = 60 * 60_000;

/** The fields a brake figure's amendment compares. */
export const BRAKE_FIELDS = [
  'measuredAt',
  'method',
  'brakeHorsepower',
  'netBrakeLoadLbf',
  'drumDiameterFt',
  'ropeDiameterFt',
  'torqueLbfFt',
  'speedRpm',
  'note',
] as const;

function need(value: number | null | undefined, path: string): number {
  if (value === null || value === undefined) throw new CalculationInputError(path, 'is needed for this method');
  return value;
}

/** Output horsepower of a figure by its method (indicated-power.ts brake formulas). Throws CalculationInputError naming a missing field. */
export function brakeFigureHorsepower(input: BrakeFigureInput): number {
  switch (input.method) {
    case 'direct':
      return need(input.brakeHorsepower, 'brakeHorsepower');
    case 'rope_brake': {
      const effectiveRadiusFt = ropeBrakeEffectiveRadiusFt({
        drumDiameterFt: need(input.drumDiameterFt, 'drumDiameterFt'),
        ropeDiameterFt: input.ropeDiameterFt ?? 0,
      });
      const torqueLbfFt = brakeTorqueLbfFt({ netBrakeLoadLbf: need(input.netBrakeLoadLbf, 'netBrakeLoadLbf'), effectiveRadiusFt });
      return brakeHorsepower({ torqueLbfFt, speedRpm: need(input.speedRpm, 'speedRpm') });
    }
    case 'torque':
      return brakeHorsepower({ torqueLbfFt: need(input.torqueLbfFt, 'torqueLbfFt'), speedRpm: need(input.speedRpm, 'speedRpm') });
  }
}

/** Keeps only the fields a method uses, so a stored figure never carries stale inputs of another method. */
export function brakeFigureFields(input: BrakeFigureInput) {
  const m = input.method;
  return {
    measuredAt: new Date(input.measuredAt),
    method: m,
    netBrakeLoadLbf: m === 'rope_brake' ? (input.netBrakeLoadLbf ?? null) : null,
    drumDiameterFt: m === 'rope_brake' ? (input.drumDiameterFt ?? null) : null,
    ropeDiameterFt: m === 'rope_brake' ? (input.ropeDiameterFt ?? null) : null,
    torqueLbfFt: m === 'torque' ? (input.torqueLbfFt ?? null) : null,
    speedRpm: m === 'direct' ? null : (input.speedRpm ?? null),
    note: input.note?.trim() || null,
    brakeHorsepower: brakeFigureHorsepower(input),
  };
}

/** Brake or measured output figures of a run (written through CardSetsService, which recomputes the sets). */
@Injectable()
export class BrakeFiguresService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(CardRecordAmendment) private readonly cardRecordAmendmentRepo: Repository<CardRecordAmendment>,
    private readonly users: UsersService,
  ) {}

  async get(id: string, m?: EntityManager): Promise<BrakeFigure> {
    const f = await (m ?? this.db.manager).findOne(BrakeFigure, { where: { id } });
    if (!f) throw new NotFoundException('No such brake figure.');
    return f;
  }

  listEntities(runId: string, m?: EntityManager): Promise<BrakeFigure[]> {
    return (m ?? this.db.manager).find(BrakeFigure, { where: { runId }, order: { measuredAt: 'ASC' } });
  }

  /** The run's figure nearest in time to `at`, within an hour; null if none. */
  nearest(figures: BrakeFigure[], at: Date): BrakeFigure | null {
    let best: BrakeFigure | null = null;
    for (const f of figures) {
      const d = Math.abs(f.measuredAt.getTime() - at.getTime());
      if (d <= BRAKE_FIGURE_WINDOW_MS && (!best || d < Math.abs(best.measuredAt.getTime() - at.getTime()))) best = f;
    }
    return best;
  }

  async toDtos(figures: BrakeFigure[]): Promise<BrakeFigureDto[]> {
    if (!figures.length) return [];
    const amendments = await this.cardRecordAmendmentRepo.find({
      where: { subjectType: 'brake_figure', subjectId: In(figures.map((f) => f.id)) },
      order: { at: 'ASC' },
    });
    const ids = [...new Set([...figures.map((f) => f.createdBy), ...amendments.map((a) => a.byUser)])];
    const name = await this.users.displayNames(ids);
    const byFigure = amendmentsBySubject(amendments, name);
    return figures.map((f) => ({
      id: f.id,
      runId: f.runId,
      measuredAt: f.measuredAt.toISOString(),
      method: f.method,
      brakeHorsepower: f.brakeHorsepower,
      brakeKilowatts: hpToKw(f.brakeHorsepower),
      netBrakeLoadLbf: f.netBrakeLoadLbf,
      drumDiameterFt: f.drumDiameterFt,
      ropeDiameterFt: f.ropeDiameterFt,
      torqueLbfFt: f.torqueLbfFt,
      speedRpm: f.speedRpm,
      note: f.note,
      createdBy: f.createdBy,
      createdByName: name.get(f.createdBy) ?? 'unknown',
      createdAt: f.createdAt.toISOString(),
      amendments: byFigure.get(f.id) ?? [],
    }));
  }
}
