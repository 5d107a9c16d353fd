import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository, type EntityManager } from 'typeorm';
import {
  CARD_RECORD_KINDS,
  type AmendBrakeFigureRequest,
  type AmendCardRequest,
  type AmendCardSetRequest,
  type BrakeFigureDto,
  type BrakeFigureInput,
  type CardInput,
  type CardSetCylinder,
  type CardSetDto,
  type CardSetPreviewDto,
  type CreateCardSetRequest,
  type FigureSource,
  type MeasurementKind,
} from '@crankjournal/shared-types';
import { RunsService } from '../runs/runs.service.js';
import { ReadingsService } from '../runs/readings.service.js';
import type { GateRule } from '../runs/start-gate.service.js';
import { EnginesService } from '../engines/engines.service.js';
import { LiveService } from '../live/live.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { CYLINDER_END_WORDS, computeCardSetResults, evaluateCard, type EvaluatedCard, type ResultCard } from './card-set-results.js';
import { BRAKE_FIELDS, BrakeFiguresService, brakeFigureFields } from './brake-figures.service.js';
import { CARD_FIELDS, SET_FIELDS, changesBetween } from './card-set-diff.js';
import { asBarometerInHg, asInHg, asPsig } from './card-set-units.js';
import { recordAmendment } from './card-set-amendments.js';
import { CardSetMapper } from './card-set-mapper.js';
import { BrakeFigure } from './brake-figure.entity.js';
import { CardImage } from './card-image.entity.js';
import { IndicatorCard } from './indicator-card.entity.js';
import { CardSet } from './card-set.entity.js';

/** Speed and pressures are taken from readings no further than this from the moment of the set. */
export const NEAREST_READING_WINDOW_MS = 30 * 60_000;
/** The barometer is read once or twice a run: any reading of the run within this of the set stands for it. */
export const BAROMETER_WINDOW_MS = 24 * 60 * 60_000;
/** A set may be stamped at most this far ahead of the server's clock (a tablet's clock drift). */
const MAX_FUTURE_MS = 5 * 60_000;

interface PreparedCard {
  input: CardInput;
  cylinder: CardSetCylinder;
  evaluated: EvaluatedCard;
}
interface PreparedSet {
  takenAt: Date;
  speedRpm: number;
  speedSource: FigureSource;
  speedReadingAt: Date | null;
  cutOffPercent: number | null;
  throttlePressurePsig: number | null;
  throttleSource: FigureSource | null;
  receiverPressurePsig: number | null;
  receiverSource: FigureSource | null;
  vacuumInHg: number | null;
  vacuumSource: FigureSource | null;
  barometerInHg: number | null;
  barometerSource: FigureSource | null;
  notes: string | null;
  cylinders: CardSetCylinder[];
  condensing: boolean;
  cards: PreparedCard[];
}

/** A run as RunsService hands it over. */
type Run = Parameters<GateRule['check']>[0];

/**
 * Card sets of a run: taking them, adding a card, amending a card or a set (never erasing), brake figures,
 * and the results of each set (computed from the pure calculations, stored with the set, broadcast live).
 */
@Injectable()
export class CardSetsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(BrakeFigure) private readonly brakeFigureRepo: Repository<BrakeFigure>,
    @InjectRepository(CardImage) private readonly cardImageRepo: Repository<CardImage>,
    @InjectRepository(CardSet) private readonly cardSetRepo: Repository<CardSet>,
    @InjectRepository(IndicatorCard) private readonly indicatorCardRepo: Repository<IndicatorCard>,
    private readonly runs: RunsService,
    private readonly readings: ReadingsService,
    private readonly engines: EnginesService,
    private readonly live: LiveService,
    private readonly brakes: BrakeFiguresService,
    private readonly mapper: CardSetMapper,
  ) {}

  // ------------------------------------------------------------------------------------------
  // Reading
  // ------------------------------------------------------------------------------------------

  async list(runId: string): Promise<CardSetDto[]> {
    await this.runs.get(runId);
    const sets = await this.cardSetRepo.find({ where: { runId }, order: { takenAt: 'ASC', createdAt: 'ASC' } });
    return this.mapper.toDtos(sets);
  }

  /**
   * The engine's indicated power from its latest complete card set (of `runId` when given, else of any run), or null.
   * The visitor board shows it with everyday equivalents.
   */
  async latestIndicatedPower(engineId: string, runId?: string): Promise<{ horsepower: number; kilowatts: number; takenAt: Date } | null> {
    const qb = this.cardSetRepo
      .createQueryBuilder('s')
      .where('s.engineId = :engineId', { engineId })
      .andWhere(`(s.results->>'complete')::boolean`)
      .orderBy('s.takenAt', 'DESC')
      .limit(1);
    if (runId) qb.andWhere('s.runId = :runId', { runId });
    const set = await qb.getOne();
    if (!set) return null;
    return { horsepower: set.results.totalIndicatedHorsepower, kilowatts: set.results.totalIndicatedKilowatts, takenAt: set.takenAt };
  }

  async get(id: string): Promise<CardSetDto> {
    const [dto] = await this.mapper.toDtos([await this.load(id)]);
    return dto;
  }

  private async load(id: string, m?: EntityManager): Promise<CardSet> {
    const s = await (m ?? this.db.manager).findOne(CardSet, { where: { id } });
    if (!s) throw new NotFoundException('No such card set.');
    return s;
  }

  async brakeFigures(runId: string): Promise<BrakeFigureDto[]> {
    await this.runs.get(runId);
    return this.brakes.toDtos(await this.brakes.listEntities(runId));
  }

  // ------------------------------------------------------------------------------------------
  // Preparing a set: speed and pressures from readings, cards checked and worked out
  // ------------------------------------------------------------------------------------------

  private async nearest(run: Run, kind: MeasurementKind, at: Date) {
    return this.readings.nearestValue(run.id, kind, at, kind === 'barometer' ? BAROMETER_WINDOW_MS : NEAREST_READING_WINDOW_MS);
  }

  private async figure(
    run: Run,
    kind: MeasurementKind,
    at: Date,
    given: number | null | undefined,
    convert: (v: number, unit: string) => number | null,
  ) {
    if (given !== undefined && given !== null) return { value: given, source: 'entered' as FigureSource, at: null };
    const r = await this.nearest(run, kind, at);
    const value = r ? convert(r.value, r.unit) : null;
    return value === null ? { value: null, source: null, at: null } : { value, source: 'reading' as FigureSource, at: r!.takenAt };
  }

  private async geometry(run: Run): Promise<{ cylinders: CardSetCylinder[]; condensing: boolean }> {
    const engine = await this.engines.detail(run.engineId);
    if (!engine.cylinders.length)
      throw new ConflictException("This engine's cylinders are not described yet; a chief engineer adds them on the engine's page first.");
    return {
      cylinders: engine.cylinders.map((c) => ({
        cylinderId: c.id,
        label: c.label,
        role: c.role,
        boreIn: c.boreIn,
        strokeIn: c.strokeIn,
        pistonRodIn: c.pistonRodIn,
        tailRodIn: c.tailRodIn,
        clearancePercent: c.clearancePercent,
      })),
      condensing: engine.measurementPoints.some((p) => p.kind === 'vacuum'),
    };
  }

  /** Checks a card against the set's cylinders and the run's images, and works out its mean pressure. */
  private async prepareCard(run: Run, cylinders: CardSetCylinder[], card: CardInput, path: string): Promise<PreparedCard> {
    const cylinder = cylinders.find((c) => c.cylinderId === card.cylinderId);
    if (!cylinder)
      throw new BadRequestException({
        statusCode: 400,
        error: 'Bad Request',
        message: [`${path}.cylinderId: not a cylinder of this run's engine`],
      });
    if (card.imageId) {
      const image = await this.cardImageRepo.findOne({ where: { id: card.imageId } });
      if (!image || image.runId !== run.id) {
        throw new BadRequestException({
          statusCode: 400,
          error: 'Bad Request',
          message: [`${path}.imageId: no image of this run has that id; upload the card image first`],
        });
      }
    }
    const evaluated = evaluateCard(card, path);
    return { input: card, cylinder, evaluated };
  }

  private async prepare(run: Run, dto: CreateCardSetRequest, opts: { seed?: boolean } = {}): Promise<PreparedSet> {
    const takenAt = new Date(dto.takenAt);
    if (Number.isNaN(takenAt.getTime())) throw new BadRequestException('takenAt must be an ISO date-time');
    if (!opts.seed && takenAt.getTime() > Date.now() + MAX_FUTURE_MS)
      throw new BadRequestException('takenAt is in the future; check the tablet’s clock.');
    const { cylinders, condensing } = await this.geometry(run);

    const speed = await this.figure(run, 'speed', takenAt, dto.speedRpm, (v, unit) => (unit === 'rpm' && v > 0 ? v : null));
    if (speed.value === null) {
      throw new BadRequestException({
        statusCode: 400,
        error: 'Bad Request',
        message: [
          `speedRpm: no speed reading within ${NEAREST_READING_WINDOW_MS / 60_000} minutes of when the set was taken; enter the speed`,
        ],
      });
    }
    const throttle = await this.figure(run, 'throttle_pressure', takenAt, dto.throttlePressurePsig, asPsig);
    const receiver = await this.figure(run, 'receiver_pressure', takenAt, dto.receiverPressurePsig, asPsig);
    const vacuum = await this.figure(run, 'vacuum', takenAt, dto.vacuumInHg, asInHg);
    const barometer = await this.figure(run, 'barometer', takenAt, dto.barometerInHg, asBarometerInHg);

    const cards: PreparedCard[] = [];
    const seen = new Set<string>();
    for (const [i, card] of (dto.cards ?? []).entries()) {
      const prepared = await this.prepareCard(run, cylinders, card, `cards[${i}]`);
      const key = `${card.cylinderId}:${card.end}`;
      if (seen.has(key)) {
        throw new BadRequestException({
          statusCode: 400,
          error: 'Bad Request',
          message: [`cards[${i}].end: a second card for the ${prepared.cylinder.label} ${CYLINDER_END_WORDS[card.end]}`],
        });
      }
      seen.add(key);
      cards.push(prepared);
    }
    return {
      takenAt,
      speedRpm: speed.value,
      speedSource: speed.source!,
      speedReadingAt: speed.at,
      cutOffPercent: dto.cutOffPercent ?? null,
      throttlePressurePsig: throttle.value,
      throttleSource: throttle.source,
      receiverPressurePsig: receiver.value,
      receiverSource: receiver.source,
      vacuumInHg: vacuum.value,
      vacuumSource: vacuum.source,
      barometerInHg: barometer.value,
      barometerSource: barometer.source,
      notes: dto.notes?.trim() || null,
      cylinders,
      condensing,
      cards,
    };
  }

  private resultsFor(
    set: Pick<
      PreparedSet,
      | 'takenAt'
      | 'speedRpm'
      | 'cylinders'
      | 'cutOffPercent'
      | 'throttlePressurePsig'
      | 'receiverPressurePsig'
      | 'vacuumInHg'
      | 'barometerInHg'
      | 'condensing'
    >,
    cards: ResultCard[],
    figures: BrakeFigure[],
  ) {
    const b = this.brakes.nearest(figures, set.takenAt);
    return computeCardSetResults({
      speedRpm: set.speedRpm,
      cylinders: set.cylinders,
      cards,
      cutOffPercent: set.cutOffPercent,
      throttlePressurePsig: set.throttlePressurePsig,
      receiverPressurePsig: set.receiverPressurePsig,
      vacuumInHg: set.vacuumInHg,
      barometerInHg: set.barometerInHg,
      condensing: set.condensing,
      brake: b ? { figureId: b.id, measuredAt: b.measuredAt.toISOString(), brakeHorsepower: b.brakeHorsepower } : null,
      computedAt: new Date(),
    });
  }

  /** A stored card as the results see it, matched to the set's own copy of its cylinder by label. */
  private static resultCard =
    (cylinders: CardSetCylinder[]) =>
    (c: IndicatorCard): ResultCard => {
      return {
        id: c.id,
        cylinderId: cylinders.find((x) => x.label === c.cylinderLabel)?.cylinderId ?? c.cylinderId ?? c.cylinderLabel,
        end: c.end,
        meanEffectivePressurePsi: c.meanEffectivePressurePsi,
        cutOffPercent: c.cutOffPercent,
        compressionPercent: c.compressionPercent,
        admissionPressurePsig: c.admissionPressurePsig,
        outline: c.outline,
      };
    };

  /** The columns of a card from its input and evaluation. */
  private static cardColumns(input: Omit<CardInput, 'cylinderId' | 'end'>, e: EvaluatedCard) {
    const traced = e.method === 'trace';
    return {
      method: e.method,
      springPsiPerIn: e.method === 'mep' ? null : (input.springPsiPerIn ?? null),
      lengthIn: e.method === 'mep' || e.method === 'ordinates' ? null : (input.lengthIn ?? null),
      areaSqIn: e.method === 'planimeter' ? (input.areaSqIn ?? null) : null,
      ordinatesIn: e.method === 'ordinates' ? (input.ordinatesIn ?? null) : null,
      givenMeanEffectivePressurePsi: e.method === 'mep' ? (input.meanEffectivePressurePsi ?? null) : null,
      imageId: input.imageId ?? null,
      trace: traced ? (input.trace ?? null) : null,
      traceOrigin: traced ? (input.traceOrigin ?? null) : null,
      cutOffPercent: input.cutOffPercent ?? null,
      compressionPercent: input.compressionPercent ?? null,
      admissionPressurePsig: input.admissionPressurePsig ?? null,
      note: input.note?.trim() || null,
      meanHeightIn: e.meanHeightIn,
      meanEffectivePressurePsi: e.meanEffectivePressurePsi,
      tracedAreaSqIn: e.tracedAreaSqIn,
      outline: e.outline,
    };
  }

  // ------------------------------------------------------------------------------------------
  // Writing
  // ------------------------------------------------------------------------------------------

  /** What a set would come to, without storing it (for the form's live figures). */
  async preview(runId: string, dto: CreateCardSetRequest): Promise<CardSetPreviewDto> {
    const run = await this.runs.get(runId);
    const p = await this.prepare(run, dto);
    const cards: ResultCard[] = p.cards.map((c, i) => ({
      id: `preview-${i}`,
      cylinderId: c.cylinder.cylinderId,
      end: c.input.end,
      meanEffectivePressurePsi: c.evaluated.meanEffectivePressurePsi,
      cutOffPercent: c.input.cutOffPercent ?? null,
      compressionPercent: c.input.compressionPercent ?? null,
      admissionPressurePsig: c.input.admissionPressurePsig ?? null,
      outline: c.evaluated.outline,
    }));
    const results = this.resultsFor(p, cards, await this.brakes.listEntities(runId));
    return {
      speedRpm: p.speedRpm,
      speedSource: p.speedSource,
      speedReadingAt: p.speedReadingAt?.toISOString() ?? null,
      throttlePressurePsig: p.throttlePressurePsig,
      throttleSource: p.throttleSource,
      receiverPressurePsig: p.receiverPressurePsig,
      receiverSource: p.receiverSource,
      vacuumInHg: p.vacuumInHg,
      vacuumSource: p.vacuumSource,
      barometerInHg: p.barometerInHg,
      barometerSource: p.barometerSource,
      cylinders: p.cylinders,
      cards: p.cards.map((c) => ({
        cylinderId: c.cylinder.cylinderId,
        end: c.input.end,
        method: c.evaluated.method,
        meanEffectivePressurePsi: c.evaluated.meanEffectivePressurePsi,
        meanHeightIn: c.evaluated.meanHeightIn,
        tracedAreaSqIn: c.evaluated.tracedAreaSqIn,
        outline: c.evaluated.outline,
      })),
      results,
    };
  }

  /**
   * Takes a card set for a run that is being prepared, running or stopped. `seed` lets the demo seed
   * record the sets of a season already closed (it bypasses the run-state checks only).
   */
  async create(
    runId: string,
    dto: CreateCardSetRequest,
    user: AuthUser | { id: string },
    opts: { seed?: boolean } = {},
  ): Promise<CardSetDto> {
    const run = await this.runs.get(runId);
    if (!opts.seed) {
      this.runs.assertOpen(run);
      this.runs.assertTakingReadings(run);
    }
    const p = await this.prepare(run, dto, opts);
    const id = await this.db.transaction(async (m) => {
      const set = await m.save(
        CardSet,
        m.create(CardSet, {
          runId,
          engineId: run.engineId,
          takenAt: p.takenAt,
          speedRpm: p.speedRpm,
          speedSource: p.speedSource,
          speedReadingAt: p.speedReadingAt,
          cutOffPercent: p.cutOffPercent,
          throttlePressurePsig: p.throttlePressurePsig,
          throttleSource: p.throttleSource,
          receiverPressurePsig: p.receiverPressurePsig,
          receiverSource: p.receiverSource,
          vacuumInHg: p.vacuumInHg,
          vacuumSource: p.vacuumSource,
          barometerInHg: p.barometerInHg,
          barometerSource: p.barometerSource,
          notes: p.notes,
          cylinders: p.cylinders,
          condensing: p.condensing,
          results: this.resultsFor(p, [], []), // replaced below, once the cards have ids
          createdBy: user.id,
        }),
      );
      const cards: IndicatorCard[] = [];
      for (const c of p.cards) {
        cards.push(
          await m.save(
            IndicatorCard,
            m.create(IndicatorCard, {
              cardSetId: set.id,
              cylinderId: c.cylinder.cylinderId,
              cylinderLabel: c.cylinder.label,
              end: c.input.end,
              ...CardSetsService.cardColumns(c.input, c.evaluated),
              createdBy: user.id,
            }),
          ),
        );
      }
      const results = this.resultsFor(p, cards.map(CardSetsService.resultCard(p.cylinders)), await this.brakes.listEntities(runId, m));
      await m.update(CardSet, { id: set.id }, { results });
      return set.id;
    });
    return this.broadcast(id);
  }

  /** Adds the card of an end not yet taken. */
  async addCard(setId: string, dto: CardInput, user: AuthUser): Promise<CardSetDto> {
    const set0 = await this.load(setId);
    const run = await this.runs.get(set0.runId);
    this.runs.assertOpen(run);
    const prepared = await this.prepareCard(run, set0.cylinders, dto, 'card');
    await this.db.transaction(async (m) => {
      const set = await m.findOne(CardSet, { where: { id: setId }, lock: { mode: 'pessimistic_write' } });
      const cards = await m.find(IndicatorCard, { where: { cardSetId: setId } });
      if (cards.some((c) => c.cylinderLabel === prepared.cylinder.label && c.end === dto.end)) {
        throw new ConflictException(
          `The ${prepared.cylinder.label} ${CYLINDER_END_WORDS[dto.end]} already has a card in this set; amend that card instead.`,
        );
      }
      const card = await m.save(
        IndicatorCard,
        m.create(IndicatorCard, {
          cardSetId: setId,
          cylinderId: prepared.cylinder.cylinderId,
          cylinderLabel: prepared.cylinder.label,
          end: dto.end,
          ...CardSetsService.cardColumns(dto, prepared.evaluated),
          createdBy: user.id,
        }),
      );
      await this.recompute(m, set!, [...cards, card]);
    });
    return this.broadcast(setId);
  }

  /** Corrects a card: the new figures replace the old ones, which stay in the amendment with who, when and why. */
  async amendCard(
    cardId: string,
    dto: AmendCardRequest,
    user: AuthUser | { id: string },
    opts: { seed?: boolean; at?: Date } = {},
  ): Promise<CardSetDto> {
    const card0 = await this.indicatorCardRepo.findOne({ where: { id: cardId } });
    if (!card0) throw new NotFoundException('No such card.');
    const set0 = await this.load(card0.cardSetId);
    const run = await this.runs.get(set0.runId);
    if (!opts.seed) this.runs.assertOpen(run);
    const cylinderId = card0.cylinderId ?? '';
    const cylinder = set0.cylinders.find((c) => c.cylinderId === cylinderId || c.label === card0.cylinderLabel);
    if (!cylinder) throw new ConflictException('This card’s cylinder is no longer part of the set.');
    const { reason, ...figures } = dto;
    const prepared = await this.prepareCard(run, set0.cylinders, { ...figures, cylinderId: cylinder.cylinderId, end: card0.end }, 'card');
    const next = CardSetsService.cardColumns(figures, prepared.evaluated);
    await this.db.transaction(async (m) => {
      const set = await m.findOne(CardSet, { where: { id: set0.id }, lock: { mode: 'pessimistic_write' } });
      const card = await m.findOne(IndicatorCard, { where: { id: cardId } });
      const changes = changesBetween(card!, next, CARD_FIELDS);
      if (!changes.length) throw new BadRequestException('Nothing would change: the figures given are the ones recorded.');
      const before = set!.results.totalIndicatedHorsepower;
      await m.update(IndicatorCard, { id: cardId }, next);
      const cards = await m.find(IndicatorCard, { where: { cardSetId: set0.id } });
      const results = await this.recompute(m, set!, cards);
      changes.push({ field: 'totalIndicatedHorsepower', from: before, to: results.totalIndicatedHorsepower });
      await recordAmendment(m, 'card', cardId, set0.runId, changes, reason, user.id, opts.at);
    });
    return this.broadcast(set0.id);
  }

  /** Corrects a set's own figures (moment, speed, cut-off, pressures, notes). */
  async amendSet(setId: string, dto: AmendCardSetRequest, user: AuthUser): Promise<CardSetDto> {
    const set0 = await this.load(setId);
    const run = await this.runs.get(set0.runId);
    this.runs.assertOpen(run);
    const takenAt = dto.takenAt !== undefined ? new Date(dto.takenAt) : set0.takenAt;
    if (takenAt.getTime() > Date.now() + MAX_FUTURE_MS)
      throw new BadRequestException('takenAt is in the future; check the tablet’s clock.');
    const patch: Partial<CardSet> = {};
    if (dto.takenAt !== undefined) patch.takenAt = takenAt;
    if (dto.speedRpm !== undefined) {
      const speed = await this.figure(run, 'speed', takenAt, dto.speedRpm, (v, unit) => (unit === 'rpm' && v > 0 ? v : null));
      if (speed.value === null)
        throw new BadRequestException({
          statusCode: 400,
          error: 'Bad Request',
          message: ['speedRpm: no speed reading near that moment; enter the speed'],
        });
      Object.assign(patch, { speedRpm: speed.value, speedSource: speed.source!, speedReadingAt: speed.at });
    }
    if (dto.cutOffPercent !== undefined) patch.cutOffPercent = dto.cutOffPercent;
    const pressure = async (kind: MeasurementKind, given: number | null | undefined, convert: (v: number, u: string) => number | null) =>
      this.figure(run, kind, takenAt, given, convert);
    if (dto.throttlePressurePsig !== undefined) {
      const f = await pressure('throttle_pressure', dto.throttlePressurePsig, asPsig);
      Object.assign(patch, { throttlePressurePsig: f.value, throttleSource: f.source });
    }
    if (dto.receiverPressurePsig !== undefined) {
      const f = await pressure('receiver_pressure', dto.receiverPressurePsig, asPsig);
      Object.assign(patch, { receiverPressurePsig: f.value, receiverSource: f.source });
    }
    if (dto.vacuumInHg !== undefined) {
      const f = await pressure('vacuum', dto.vacuumInHg, asInHg);
      Object.assign(patch, { vacuumInHg: f.value, vacuumSource: f.source });
    }
    if (dto.barometerInHg !== undefined) {
      const f = await pressure('barometer', dto.barometerInHg, asBarometerInHg);
      Object.assign(patch, { barometerInHg: f.value, barometerSource: f.source });
    }
    if (dto.notes !== undefined) patch.notes = dto.notes?.trim() || null;
    await this.db.transaction(async (m) => {
      const set = await m.findOne(CardSet, { where: { id: setId }, lock: { mode: 'pessimistic_write' } });
      const changes = changesBetween(set!, patch, SET_FIELDS);
      if (!changes.length) throw new BadRequestException('Nothing would change: the figures given are the ones recorded.');
      const before = set!.results.totalIndicatedHorsepower;
      Object.assign(set!, patch);
      await m.update(CardSet, { id: setId }, patch);
      const results = await this.recompute(m, set!, await m.find(IndicatorCard, { where: { cardSetId: setId } }));
      changes.push({ field: 'totalIndicatedHorsepower', from: before, to: results.totalIndicatedHorsepower });
      await recordAmendment(m, 'card_set', setId, set0.runId, changes, dto.reason, user.id);
    });
    return this.broadcast(setId);
  }

  private async recompute(m: EntityManager, set: CardSet, cards: IndicatorCard[]) {
    const results = this.resultsFor(
      set,
      cards.map(CardSetsService.resultCard(set.cylinders)),
      await this.brakes.listEntities(set.runId, m),
    );
    await m.update(CardSet, { id: set.id }, { results });
    return results;
  }

  // ------------------------------------------------------------------------------------------
  // Brake figures (each change recomputes the run's sets)
  // ------------------------------------------------------------------------------------------

  async addBrakeFigure(
    runId: string,
    dto: BrakeFigureInput,
    user: AuthUser | { id: string },
    opts: { seed?: boolean } = {},
  ): Promise<BrakeFigureDto> {
    const run = await this.runs.get(runId);
    if (!opts.seed) this.runs.assertOpen(run);
    const fields = brakeFigureFields(dto);
    const saved = await this.brakeFigureRepo.save(this.brakeFigureRepo.create({ runId, ...fields, createdBy: user.id }));
    await this.recomputeRun(runId);
    const [out] = await this.brakes.toDtos([saved]);
    this.live.emitToRoom(`run:${runId}`, 'run:record', { runId, kind: CARD_RECORD_KINDS.brakeFigure, id: out.id, data: out });
    return out;
  }

  async amendBrakeFigure(id: string, dto: AmendBrakeFigureRequest, user: AuthUser): Promise<BrakeFigureDto> {
    const f0 = await this.brakes.get(id);
    const run = await this.runs.get(f0.runId);
    this.runs.assertOpen(run);
    const { reason, ...given } = dto;
    const merged: BrakeFigureInput = {
      measuredAt: given.measuredAt ?? f0.measuredAt.toISOString(),
      method: given.method ?? f0.method,
      brakeHorsepower: given.brakeHorsepower !== undefined ? given.brakeHorsepower : f0.brakeHorsepower,
      netBrakeLoadLbf: given.netBrakeLoadLbf !== undefined ? given.netBrakeLoadLbf : f0.netBrakeLoadLbf,
      drumDiameterFt: given.drumDiameterFt !== undefined ? given.drumDiameterFt : f0.drumDiameterFt,
      ropeDiameterFt: given.ropeDiameterFt !== undefined ? given.ropeDiameterFt : f0.ropeDiameterFt,
      torqueLbfFt: given.torqueLbfFt !== undefined ? given.torqueLbfFt : f0.torqueLbfFt,
      speedRpm: given.speedRpm !== undefined ? given.speedRpm : f0.speedRpm,
      note: given.note !== undefined ? given.note : f0.note,
    };
    const next = brakeFigureFields(merged);
    await this.db.transaction(async (m) => {
      const cur = await m.findOne(BrakeFigure, { where: { id }, lock: { mode: 'pessimistic_write' } });
      const changes = changesBetween(cur!, next, BRAKE_FIELDS);
      if (!changes.length) throw new BadRequestException('Nothing would change: the figures given are the ones recorded.');
      await m.update(BrakeFigure, { id }, next);
      await recordAmendment(m, 'brake_figure', id, f0.runId, changes, reason, user.id);
    });
    await this.recomputeRun(f0.runId);
    const [out] = await this.brakes.toDtos([await this.brakes.get(id)]);
    this.live.emitToRoom(`run:${f0.runId}`, 'run:record', { runId: f0.runId, kind: CARD_RECORD_KINDS.brakeFigure, id, data: out });
    return out;
  }

  /** Recomputes every set of a run (after its brake figures change) and broadcasts them. */
  private async recomputeRun(runId: string) {
    const sets = await this.cardSetRepo.find({ where: { runId } });
    for (const s of sets) {
      await this.db.transaction(async (m) => {
        const set = await m.findOne(CardSet, { where: { id: s.id }, lock: { mode: 'pessimistic_write' } });
        await this.recompute(m, set!, await m.find(IndicatorCard, { where: { cardSetId: s.id } }));
      });
      await this.broadcast(s.id);
    }
  }

  // ------------------------------------------------------------------------------------------
  // Answers
  // ------------------------------------------------------------------------------------------

  private async broadcast(setId: string): Promise<CardSetDto> {
    const dto = await this.get(setId);
    this.live.emitToRoom(`run:${dto.runId}`, 'run:record', { runId: dto.runId, kind: CARD_RECORD_KINDS.cardSet, id: dto.id, data: dto });
    return dto;
  }
}
