import { randomBytes, randomUUID } from 'node:crypto';
import {
  BadRequestException,
  ConflictException,
  Injectable,
  Logger,
  NotFoundException,
  UnsupportedMediaTypeException,
  type OnModuleDestroy,
} from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import type { Namespace } from 'socket.io';
import type {
  CreateVisitorBoardRequest,
  UpdateVisitorBoardRequest,
  VisitorBoardDto,
  VisitorBoardView,
  VisitorFigures,
  VisitServerToClientEvents,
} from '@crankjournal/shared-types';
import { AppConfig } from '../../config/app-config.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { sniffImage } from '../../common/util/image-sniff.js';
import { revolutionsFromSpeedRecord } from '../../calculations/run-derived.js';
import { horsesFromHorsepower, smallCarEnginesFromHorsepower, smoothedLatestValue } from '../../calculations/visitor-figures.js';
import { isRpm, pressureScaleOf, psigFromScale, psigOnScale } from '../../calculations/units.js';
import { RunsService, type RunRecord } from '../runs/runs.service.js';
import { ReadingsService } from '../runs/readings.service.js';
import { EnginesService } from '../engines/engines.service.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { CardSetsService } from '../indicator-cards/card-sets.service.js';
import { StorageService } from '../storage/storage.service.js';
import { VisitorBoard } from './visitor-board.entity.js';

/** Between instances: a board's visitors are to be ended (its id). */
const END_BOARD = 'visit:end-board';
/** Between instances: how many visitors each instance has on each board (for the cap per board, which is cluster-wide). */
const VIEWER_COUNTS = 'visit:viewer-counts';
/** Another instance's counts are believed for this long after it sent them (it sends them every FIGURES_EVERY_MS). */
const COUNTS_FRESH_MS = 3 * 2_000;

/** The public namespace's server: it only ever sends (VisitServerToClientEvents); `data.boardId` is the board a visitor watches. */
export type VisitNamespace = Namespace<Record<string, never>, VisitServerToClientEvents, Record<string, never>, { boardId: string }>;

/** Readings within this window before the newest one are averaged for the visitors. */
export const SMOOTHING_WINDOW_MS = 15_000;
/** How often the figures go out to the visitors of each watched board. */
export const FIGURES_EVERY_MS = 2_000;
/** A new slug: 18 random bytes, URL-safe (24 characters, 144 bits). */
export const newSlug = () => randomBytes(18).toString('base64url');
const ENDED = 'This visitor board has been switched off or has moved to a new address.';

export const boardRoom = (boardId: string) => `board:${boardId}`;

/**
 * Visitor boards: the chief engineer's side (switch on and off, new address, story and photo) and the public side
 * (figures delayed and smoothed, read-only). What leaves for the public is built here field by field, never spread
 * from a crew record, so that no name, alarm, limit or other crew detail can slip through.
 */
@Injectable()
export class VisitService implements OnModuleDestroy {
  private readonly logger = new Logger('Visit');
  private server: VisitNamespace | null = null;
  private timer: NodeJS.Timeout | null = null;
  private busy = false;
  /** This instance, as the others know it in their viewer counts. */
  private readonly instanceId = randomUUID();
  /** The other instances' visitors per board, as they last said. */
  private readonly remoteCounts = new Map<string, { at: number; counts: Record<string, number> }>();
  private sentNoVisitors = true;

  constructor(
    @InjectRepository(VisitorBoard) private readonly boards: Repository<VisitorBoard>,
    private readonly runs: RunsService,
    private readonly readings: ReadingsService,
    private readonly engines: EnginesService,
    private readonly alarms: AlarmsService,
    private readonly cards: CardSetsService,
    private readonly storage: StorageService,
    private readonly config: AppConfig,
  ) {}

  get delaySeconds(): number {
    return this.config.get('VISIT_DELAY_SECONDS');
  }
  get viewerCap(): number {
    return this.config.get('VISIT_VIEWERS_PER_BOARD');
  }

  // ------------------------------------------------------------------------------------------
  // The chief engineer's side
  // ------------------------------------------------------------------------------------------

  async list(): Promise<VisitorBoardDto[]> {
    const rows = await this.boards.find({ order: { createdAt: 'DESC' } });
    return Promise.all(rows.map((b) => this.toDto(b)));
  }

  async create(dto: CreateVisitorBoardRequest, me: AuthUser): Promise<VisitorBoardDto> {
    if (!!dto.runId === !!dto.engineId) throw new BadRequestException('Give either runId (a board of one run) or engineId (of an engine).');
    let engineId: string;
    if (dto.runId) {
      const run = await this.runs.get(dto.runId);
      if (run.state === 'closed' || run.state === 'abandoned')
        throw new ConflictException('This run is over: a visitor board follows a run that is still to come or under way.');
      engineId = run.engineId;
      if (await this.boards.findOne({ where: { runId: dto.runId } })) throw new ConflictException('This run already has a visitor board.');
    } else {
      engineId = (await this.engines.get(dto.engineId!)).id;
      const existing = await this.boards.createQueryBuilder('b').where('b.engineId = :engineId AND b.runId IS NULL', { engineId }).getOne();
      if (existing) throw new ConflictException('This engine already has a visitor board.');
    }
    const saved = await this.boards.save(
      this.boards.create({
        scope: dto.runId ? 'run' : 'engine',
        engineId,
        runId: dto.runId ?? null,
        slug: newSlug(),
        enabled: true,
        story: '',
        createdBy: me.id,
      }),
    );
    return this.toDto(saved);
  }

  async update(id: string, dto: UpdateVisitorBoardRequest): Promise<VisitorBoardDto> {
    const b = await this.getBoard(id);
    if (dto.enabled !== undefined) b.enabled = dto.enabled;
    if (dto.story !== undefined) b.story = dto.story.trim();
    const saved = await this.boards.save(b);
    if (!saved.enabled) this.endViewers(saved.id);
    return this.toDto(saved);
  }

  /** A new address at once: the old one answers 404 and its visitors are disconnected. */
  async changeSlug(id: string): Promise<VisitorBoardDto> {
    const b = await this.getBoard(id);
    b.slug = newSlug();
    const saved = await this.boards.save(b);
    this.endViewers(saved.id);
    return this.toDto(saved);
  }

  async setPhoto(id: string, body: Buffer): Promise<VisitorBoardDto> {
    const b = await this.getBoard(id);
    const sniffed = await sniffImage(body);
    if (!sniffed) throw new UnsupportedMediaTypeException('The photo must be a PNG, JPEG or WebP image.');
    const key = `visit/${b.id}/${randomUUID()}.${sniffed.contentType.split('/')[1]}`;
    await this.storage.put(key, body, sniffed.contentType);
    b.photoKey = key;
    b.photoContentType = sniffed.contentType;
    return this.toDto(await this.boards.save(b));
  }

  async removePhoto(id: string): Promise<VisitorBoardDto> {
    const b = await this.getBoard(id);
    b.photoKey = null;
    b.photoContentType = null;
    return this.toDto(await this.boards.save(b));
  }

  /** The photo for the chief engineer's own screen (whether the board is on or off). */
  async crewPhoto(id: string): Promise<{ body: Buffer; contentType: string }> {
    return this.photoOf(await this.getBoard(id));
  }

  private async getBoard(id: string): Promise<VisitorBoard> {
    const b = await this.boards.findOne({ where: { id } });
    if (!b) throw new NotFoundException('No such visitor board.');
    return b;
  }

  private async toDto(b: VisitorBoard): Promise<VisitorBoardDto> {
    const followsLabel = b.runId ? (await this.runs.get(b.runId)).title : (await this.engines.get(b.engineId)).name;
    return {
      id: b.id,
      scope: b.scope,
      engineId: b.engineId,
      runId: b.runId,
      followsLabel,
      enabled: b.enabled,
      slug: b.slug,
      path: `/visit/${b.slug}`,
      story: b.story,
      hasPhoto: !!b.photoKey,
      updatedAt: b.updatedAt.toISOString(),
    };
  }

  // ------------------------------------------------------------------------------------------
  // The public side
  // ------------------------------------------------------------------------------------------

  /** The switched-on board at this address, or null (an unknown address and a switched-off board look the same). */
  async enabledBoard(slug: unknown): Promise<VisitorBoard | null> {
    if (typeof slug !== 'string' || !/^[A-Za-z0-9_-]{8,64}$/.test(slug)) return null;
    return this.boards.findOne({ where: { slug, enabled: true } });
  }

  private async publicBoard(slug: string): Promise<VisitorBoard> {
    const b = await this.enabledBoard(slug);
    if (!b) throw new NotFoundException('There is no visitor board at this address, or it has been switched off.');
    return b;
  }

  async view(slug: string): Promise<VisitorBoardView> {
    const b = await this.publicBoard(slug);
    const engine = await this.engines.get(b.engineId);
    const title = b.runId ? (await this.runs.get(b.runId)).title : engine.name;
    return {
      slug: b.slug,
      engineName: engine.name,
      title,
      story: b.story,
      photoPath: b.photoKey ? `/api/visit/${b.slug}/photo` : null,
      figures: await this.figures(b),
    };
  }

  async publicPhoto(slug: string): Promise<{ body: Buffer; contentType: string }> {
    return this.photoOf(await this.publicBoard(slug));
  }

  private async photoOf(b: VisitorBoard): Promise<{ body: Buffer; contentType: string }> {
    if (!b.photoKey) throw new NotFoundException('This visitor board has no photo.');
    const { body } = await this.storage.get(b.photoKey);
    return { body, contentType: b.photoContentType ?? 'application/octet-stream' };
  }

  /** The run the board shows now: its own run, or the engine's run under way (null when none). */
  private async runOf(b: VisitorBoard): Promise<RunRecord | null> {
    if (b.runId) return this.runs.get(b.runId);
    return this.runs.activeRunOf(b.engineId);
  }

  /** The figures a visitor sees, as of `delaySeconds` ago. */
  async figures(b: VisitorBoard, now = new Date()): Promise<VisitorFigures> {
    const delaySeconds = this.delaySeconds;
    const cutoff = new Date(now.getTime() - delaySeconds * 1000);
    const run = await this.runOf(b);
    const power =
      (run ? await this.cards.latestIndicatedPower(b.engineId, run.id) : null) ?? (await this.cards.latestIndicatedPower(b.engineId));
    const base: VisitorFigures = {
      state: 'resting',
      speedRpm: null,
      revolutionsSinceStart: null,
      steamPressurePsig: null,
      steamPressureBar: null,
      indicatedHorsepower: power ? round(power.horsepower, 1) : null,
      indicatedKilowatts: power ? round(power.kilowatts, 1) : null,
      horses: power ? Math.round(horsesFromHorsepower(power.horsepower)) : null,
      smallCarEngines: power ? round(smallCarEnginesFromHorsepower(power.horsepower), 1) : null,
      delaySeconds,
      at: cutoff.toISOString(),
    };
    if (!run || run.state !== 'running' || !run.startedAt) return base;
    const open = await this.alarms.openCountByRun([run.id]);
    if ((open.get(run.id) ?? 0) > 0) return base;
    const { points } = await this.engines.withPoints(b.engineId);
    const speedIds = points.filter((p) => p.kind === 'speed' && isRpm(p.unit)).map((p) => p.id);
    const pressurePoints = points.filter(
      (p) => p.kind === 'throttle_pressure' && pressureScaleOf(p.unit) && pressureScaleOf(p.unit) !== 'inHg_vacuum',
    );
    const speed = await this.readings.arrivedBy(run.id, speedIds, cutoff, run.startedAt);
    const recentFrom = new Date(cutoff.getTime() - 10 * 60_000);
    const pressure = await this.readings.arrivedBy(
      run.id,
      pressurePoints.map((p) => p.id),
      cutoff,
      recentFrom,
    );
    const scaleOf = new Map(pressurePoints.map((p) => [p.id, pressureScaleOf(p.unit)!]));
    const recentSpeed = speed.filter((r) => r.takenAt >= recentFrom);
    const speedRpm = smoothedLatestValue(
      recentSpeed.map((r) => ({ takenAtMs: r.takenAt.getTime(), value: r.value })),
      SMOOTHING_WINDOW_MS,
    );
    const psig = smoothedLatestValue(
      pressure.map((r) => ({ takenAtMs: r.takenAt.getTime(), value: psigFromScale(r.value, scaleOf.get(r.pointId)!) ?? Number.NaN })),
      SMOOTHING_WINDOW_MS,
    );
    const revolutions = revolutionsFromSpeedRecord(
      speed.map((r) => ({ takenAtMs: r.takenAt.getTime(), speedRpm: r.value })),
      run.startedAt.getTime(),
      Math.max(run.startedAt.getTime(), cutoff.getTime()),
    );
    return {
      ...base,
      state: 'working',
      speedRpm: speedRpm === null ? null : round(speedRpm, 1),
      revolutionsSinceStart: Math.floor(revolutions),
      steamPressurePsig: psig === null ? null : round(psig, 0),
      steamPressureBar: psig === null ? null : round(psigOnScale(psig, 'bar_gauge')!, 1),
    };
  }

  /** The figures of a switched-on board (null when it is off or gone). */
  async figuresOfBoard(boardId: string): Promise<VisitorFigures | null> {
    const b = await this.boards.findOne({ where: { id: boardId, enabled: true } });
    return b ? this.figures(b) : null;
  }

  // ------------------------------------------------------------------------------------------
  // The public namespace
  // ------------------------------------------------------------------------------------------

  attach(server: VisitNamespace) {
    this.server = server;
    // Another instance ended a board (switched off or given a new address): end its visitors here too.
    server.on(END_BOARD, (boardId: unknown) => {
      if (typeof boardId === 'string') this.endLocalViewers(boardId);
    });
    server.on(VIEWER_COUNTS, (msg: unknown) => {
      const m = msg as { from?: unknown; counts?: unknown };
      if (typeof m?.from !== 'string' || m.from === this.instanceId || typeof m.counts !== 'object' || m.counts === null) return;
      this.remoteCounts.set(m.from, { at: Date.now(), counts: m.counts as Record<string, number> });
    });
    this.timer = setInterval(() => void this.sendFigures(), FIGURES_EVERY_MS);
    this.timer.unref();
  }

  onModuleDestroy() {
    if (this.timer) clearInterval(this.timer);
  }

  /** Visitors of a board on this instance. */
  viewersOf(boardId: string): number {
    return this.server?.adapter.rooms.get(boardRoom(boardId))?.size ?? 0;
  }

  /**
   * Visitors of a board on every instance: this one's, plus what the others said in the last few seconds (each sends
   * its counts with every round of figures). The cap per board holds across instances to within one round's arrivals.
   */
  viewersEverywhere(boardId: string): number {
    const now = Date.now();
    let n = this.viewersOf(boardId);
    for (const [from, r] of this.remoteCounts) {
      if (now - r.at > COUNTS_FRESH_MS) this.remoteCounts.delete(from);
      else n += Number(r.counts[boardId]) || 0;
    }
    return n;
  }

  /** Tells the other instances how many visitors this one has per board (once more when it has none left). */
  private shareCounts(watched: string[]) {
    if (!this.server || (!watched.length && this.sentNoVisitors)) return;
    const counts = Object.fromEntries(watched.map((id) => [id, this.viewersOf(id)]));
    this.server.serverSideEmit(VIEWER_COUNTS, { from: this.instanceId, counts });
    this.sentNoVisitors = !watched.length;
  }

  /**
   * Sends each watched board's figures to its visitors (one computation per board, whatever the number of visitors).
   * Every instance serves its own visitors (`local`): with several instances on one adapter a broadcast would reach
   * the others' visitors as well, and they would get each figure once per instance.
   */
  async sendFigures() {
    if (this.busy || !this.server) return;
    this.busy = true;
    try {
      const watched = [...this.server.adapter.rooms.keys()].filter((r) => r.startsWith('board:')).map((r) => r.slice('board:'.length));
      this.shareCounts(watched);
      if (!watched.length) return;
      const rows = await this.boards.find({ where: watched.map((id) => ({ id, enabled: true })) });
      for (const b of rows) this.server.local.to(boardRoom(b.id)).emit('visit:figures', await this.figures(b));
    } catch (e) {
      this.logger.warn(`visitor figures not sent: ${(e as Error).message}`);
    } finally {
      this.busy = false;
    }
  }

  /**
   * Ends a board's visitors on every instance. Each instance tells its own visitors and then disconnects them: a
   * broadcast through the adapter reaches this instance's sockets only after the database has carried it, by which
   * time a cluster-wide disconnect would already have closed them, and the visitors would miss the reason.
   */
  private endViewers(boardId: string) {
    if (!this.server) return;
    this.endLocalViewers(boardId);
    this.server.serverSideEmit(END_BOARD, boardId);
  }

  private endLocalViewers(boardId: string) {
    if (!this.server) return;
    this.server.local.to(boardRoom(boardId)).emit('visit:ended', { message: ENDED });
    this.server.local.in(boardRoom(boardId)).disconnectSockets(false);
  }
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
