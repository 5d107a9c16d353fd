import { BadRequestException, ConflictException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, type EntityManager, Repository } from 'typeorm';
import {
  LOT_STATUS_LABELS,
  barLotNumber,
  LOT_STATUSES,
  LOT_STATUSES_OPEN_TO_QUOTES,
  nextLotStatus,
  productLabel,
  type LotDetail,
  type LotStatus,
  type LotSummary,
  type LotTransitionRequest,
  type LotUpdateRequest,
  type LotWriteRequest,
  type QuoteDto,
  type QuoteRequest,
  type SendQuoteRequest,
} from '@crankjournal/shared-types';
import { RunsService } from '../runs/runs.service.js';
import { MailService } from '../mail/mail.service.js';
import { UsersService } from '../users/users.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { buildQuote } from '../../calculations/quote.js';
import { CustomerLot } from './customer-lot.entity.js';
import { LotStatusChange } from './lot-status-change.entity.js';
import { LotRun } from './lot-run.entity.js';
import { LotQuote, type QuoteInputs } from './lot-quote.entity.js';
import { MillBar } from './mill-bar.entity.js';
import { MillService } from './mill.service.js';
import { RollingLogService } from './rolling-log.service.js';
import { QuotePdfService } from './quote-pdf.service.js';

const label = (s: LotStatus) => LOT_STATUS_LABELS[s].toLowerCase();

/**
 * Asked before a lot goes on the roll plan (status `on_roll_plan`): why it may not yet, or null. Feature modules
 * register theirs (payments: the deposit is not paid); the chief engineer may override with a reason.
 */
export type RollPlanGate = (lotId: string) => Promise<string | null>;

@Injectable()
export class LotsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(CustomerLot) private readonly customerLotRepo: Repository<CustomerLot>,
    @InjectRepository(LotQuote) private readonly lotQuoteRepo: Repository<LotQuote>,
    @InjectRepository(LotRun) private readonly lotRunRepo: Repository<LotRun>,
    @InjectRepository(LotStatusChange) private readonly lotStatusChangeRepo: Repository<LotStatusChange>,
    @InjectRepository(MillBar) private readonly millBarRepo: Repository<MillBar>,
    private readonly mills: MillService,
    private readonly rolling: RollingLogService,
    private readonly runs: RunsService,
    private readonly pdf: QuotePdfService,
    private readonly mail: MailService,
    private readonly users: UsersService,
  ) {}

  private readonly rollPlanGates: RollPlanGate[] = [];

  registerRollPlanGate(gate: RollPlanGate): void {
    this.rollPlanGates.push(gate);
  }

  async get(id: string): Promise<CustomerLot> {
    const l = await this.customerLotRepo.findOne({ where: { id } });
    if (!l) throw new NotFoundException('No such customer lot.');
    return l;
  }

  async list(filter: { status?: LotStatus }): Promise<LotSummary[]> {
    const rows = await this.customerLotRepo.find({
      where: filter.status ? { status: filter.status } : {},
      order: { dueDate: 'ASC', reference: 'ASC' },
    });
    return this.summaries(rows);
  }

  private async summaries(rows: CustomerLot[]): Promise<LotSummary[]> {
    if (!rows.length) return [];
    const latest: { lot_id: string; total: string; currency: string }[] = await this.db.query(
      `SELECT DISTINCT ON (lot_id) lot_id, total, currency FROM mill_quotes WHERE lot_id = ANY($1) ORDER BY lot_id, number DESC`,
      [rows.map((r) => r.id)],
    );
    const millIds = [...new Set(rows.map((r) => r.millId).filter((x): x is string => !!x))];
    const currencyByMill = new Map<string, string>();
    for (const id of millIds) currencyByMill.set(id, (await this.mills.get(id)).quoteRates.currency);
    return rows.map((l) => {
      const q = latest.find((x) => x.lot_id === l.id);
      return {
        id: l.id,
        reference: l.reference,
        customerName: l.customerName,
        productShape: l.productShape,
        productHeightMm: l.productHeightMm,
        productWidthMm: l.productWidthMm,
        steelGrade: l.steelGrade,
        quantityTonnes: l.quantityTonnes,
        dueDate: l.dueDate,
        status: l.status,
        producedTonnes: l.producedTonnes,
        scrappedTonnes: l.scrappedTonnes,
        latestQuoteTotal: q ? Number(q.total) : null,
        currency: q?.currency ?? (l.millId ? currencyByMill.get(l.millId) : undefined) ?? 'GBP',
        updatedAt: l.updatedAt.toISOString(),
      };
    });
  }

  async detail(id: string): Promise<LotDetail> {
    const l = await this.get(id);
    const [summary] = await this.summaries([l]);
    const history = await this.lotStatusChangeRepo.find({ where: { lotId: id }, order: { at: 'ASC' } });
    const links = await this.rolling.linkedRunIds(id);
    const runs = [];
    for (const link of links) {
      const r = await this.runs.get(link.runId);
      runs.push({ id: r.id, title: r.title, state: r.state, plannedFor: r.plannedFor });
    }
    const bars = await this.rolling.lotBars(id);
    const barRows = await this.millBarRepo.find({ where: { lotId: id } });
    const kg = (scrapped: boolean) => barRows.filter((b) => b.scrapped === scrapped).reduce((s, b) => s + (b.weightKg ?? 0), 0);
    const quotes = await this.quotes(id);
    const names = await this.names(history.map((h) => h.byUser));
    return {
      ...summary,
      customerEmail: l.customerEmail,
      customerContact: l.customerContact,
      carbonPct: l.carbonPct,
      notes: l.notes,
      millId: l.millId,
      nextStatus: nextLotStatus(l.status),
      history: history.map((h) => ({
        from: h.fromStatus,
        to: h.toStatus,
        byName: names.get(h.byUser) ?? 'unknown',
        at: h.at.toISOString(),
        note: h.note,
      })),
      runs,
      bars,
      barTonnes: { produced: kg(false) / 1000, scrapped: kg(true) / 1000 },
      quotes,
      createdAt: l.createdAt.toISOString(),
    };
  }

  private async names(ids: string[]): Promise<Map<string, string>> {
    return this.users.displayNames(ids);
  }

  /** A bar-lot number (BL26-014), numbered per year it went on the slate. */
  private async nextReference(m: EntityManager, at: Date): Promise<string> {
    const year = at.getUTCFullYear();
    await m.query(`SELECT pg_advisory_xact_lock(hashtext('mill_lots_reference'))`);
    const [{ n }] = await m.query(`SELECT count(*)::int AS n FROM mill_lots WHERE reference LIKE $1`, [
      `${barLotNumber(year, 0).slice(0, 5)}%`,
    ]);
    return barLotNumber(year, n + 1);
  }

  async create(dto: LotWriteRequest, user: AuthUser, opts: { reference?: string; createdAt?: Date } = {}): Promise<LotDetail> {
    const millId = dto.millId ?? (await this.mills.first())?.id ?? null;
    if (dto.millId)
      await this.mills.get(dto.millId).catch(() => {
        throw new BadRequestException('millId names no mill.');
      });
    const id = await this.db.transaction(async (m) => {
      const at = opts.createdAt ?? new Date();
      const lot = await m.save(
        CustomerLot,
        m.create(CustomerLot, {
          reference: opts.reference ?? (await this.nextReference(m, at)),
          customerName: dto.customerName.trim(),
          customerEmail: dto.customerEmail.trim().toLowerCase(),
          customerContact: dto.customerContact?.trim() ?? '',
          productShape: dto.productShape,
          productHeightMm: dto.productHeightMm,
          productWidthMm: dto.productWidthMm,
          steelGrade: dto.steelGrade.trim(),
          carbonPct: dto.carbonPct ?? null,
          quantityTonnes: dto.quantityTonnes,
          dueDate: dto.dueDate,
          status: 'on_the_slate',
          millId,
          notes: dto.notes ?? '',
          createdBy: user.id,
          ...(opts.createdAt ? { createdAt: opts.createdAt } : {}),
        }),
      );
      await m.insert(LotStatusChange, { lotId: lot.id, fromStatus: null, toStatus: 'on_the_slate', byUser: user.id, at, note: null });
      return lot.id;
    });
    return this.detail(id);
  }

  private assertNotDelivered(l: CustomerLot) {
    if (l.status === 'dispatched')
      throw new ConflictException(`Lot ${l.reference} is dispatched: its record is closed and can no longer be changed.`);
  }

  async update(id: string, dto: LotUpdateRequest): Promise<LotDetail> {
    const l = await this.get(id);
    this.assertNotDelivered(l);
    const patch: Partial<CustomerLot> = {};
    const priced = !LOT_STATUSES_OPEN_TO_QUOTES.includes(l.status);
    const repriced =
      (dto.quantityTonnes !== undefined && dto.quantityTonnes !== l.quantityTonnes) ||
      (dto.productShape !== undefined && dto.productShape !== l.productShape) ||
      (dto.productHeightMm !== undefined && dto.productHeightMm !== l.productHeightMm) ||
      (dto.productWidthMm !== undefined && dto.productWidthMm !== l.productWidthMm);
    if (priced && repriced)
      throw new ConflictException(
        `Lot ${l.reference} is ${label(l.status)}: its product and quantity were priced. Put a new lot on the slate for a change.`,
      );
    if (dto.customerName !== undefined) patch.customerName = dto.customerName.trim();
    if (dto.customerEmail !== undefined) patch.customerEmail = dto.customerEmail.trim().toLowerCase();
    if (dto.customerContact !== undefined) patch.customerContact = dto.customerContact.trim();
    if (dto.productShape !== undefined) patch.productShape = dto.productShape;
    if (dto.productHeightMm !== undefined) patch.productHeightMm = dto.productHeightMm;
    if (dto.productWidthMm !== undefined) patch.productWidthMm = dto.productWidthMm;
    if (dto.steelGrade !== undefined) patch.steelGrade = dto.steelGrade.trim();
    if (dto.carbonPct !== undefined) patch.carbonPct = dto.carbonPct;
    if (dto.quantityTonnes !== undefined) patch.quantityTonnes = dto.quantityTonnes;
    if (dto.dueDate !== undefined) patch.dueDate = dto.dueDate;
    if (dto.notes !== undefined) patch.notes = dto.notes;
    if (dto.producedTonnes !== undefined) patch.producedTonnes = dto.producedTonnes;
    if (dto.scrappedTonnes !== undefined) patch.scrappedTonnes = dto.scrappedTonnes;
    if (dto.millId !== undefined) {
      await this.mills.get(dto.millId).catch(() => {
        throw new BadRequestException('millId names no mill.');
      });
      patch.millId = dto.millId;
    }
    if (Object.keys(patch).length) await this.customerLotRepo.update({ id }, patch);
    return this.detail(id);
  }

  /** One step at a time, forward only; each step has what it needs first. */
  async transition(id: string, dto: LotTransitionRequest, user: AuthUser, at = new Date()): Promise<LotDetail> {
    const l = await this.get(id);
    const next = nextLotStatus(l.status);
    if (dto.to === l.status) throw new ConflictException(`Lot ${l.reference} is already ${label(l.status)}.`);
    if (dto.to !== next) {
      const back = LOT_STATUSES.indexOf(dto.to) < LOT_STATUSES.indexOf(l.status);
      throw new ConflictException(
        next === null
          ? `Lot ${l.reference} is dispatched: there is no step after that.`
          : back
            ? `Lot ${l.reference} is ${label(l.status)}; a lot does not go back to ${label(dto.to)}.`
            : `Lot ${l.reference} is ${label(l.status)}; its next step is ${label(next)}, so it cannot skip to ${label(dto.to)}.`,
      );
    }
    if (dto.to === 'priced' && !(await this.lotQuoteRepo.exists({ where: { lotId: id } })))
      throw new ConflictException('Make a quote for the lot before marking it priced.');
    if (dto.to === 'on_roll_plan' && !(await this.lotRunRepo.exists({ where: { lotId: id } })))
      throw new ConflictException('Link the run that will roll the lot before putting it on the roll plan.');
    if (dto.to === 'rolled' && !(l.producedTonnes > 0))
      throw new ConflictException('Record the tonnage produced before marking the lot rolled.');
    let note = dto.note?.trim() || null;
    if (dto.to === 'on_roll_plan') {
      const refusals = (await Promise.all(this.rollPlanGates.map((g) => g(id)))).filter((r): r is string => !!r);
      const reason = dto.overrideReason?.trim();
      if (refusals.length && !reason)
        throw new ConflictException(`${refusals.join(' ')} The chief engineer may put it on the roll plan with a reason.`);
      if (refusals.length && user.role !== 'chief_engineer')
        throw new ForbiddenException('Only the chief engineer may put a lot on the roll plan before its deposit is paid.');
      if (refusals.length) note = [`Override by the chief engineer: ${reason}`, `(${refusals.join(' ')})`, note].filter(Boolean).join(' ');
    }
    await this.db.transaction(async (m) => {
      const cur = await m.findOne(CustomerLot, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!cur || cur.status !== l.status) throw new ConflictException('Someone else moved this lot a moment ago. Look again and retry.');
      await m.update(CustomerLot, { id }, { status: dto.to });
      await m.insert(LotStatusChange, {
        lotId: id,
        fromStatus: l.status,
        toStatus: dto.to,
        byUser: user.id,
        at,
        note,
      });
    });
    return this.detail(id);
  }

  /** The customer paid the deposit: a lot still priced is ordered (by the person who asked for the money). */
  async acceptOnDeposit(id: string, byUser: string, at: Date, note: string): Promise<void> {
    await this.db.transaction(async (m) => {
      const cur = await m.findOne(CustomerLot, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!cur || cur.status !== 'priced') return;
      await m.update(CustomerLot, { id }, { status: 'ordered' });
      await m.insert(LotStatusChange, { lotId: id, fromStatus: 'priced', toStatus: 'ordered', byUser, at, note });
    });
  }

  async linkRun(id: string, runId: string, user: AuthUser): Promise<LotDetail> {
    const l = await this.get(id);
    this.assertNotDelivered(l);
    await this.rolling.assertRunExists(runId);
    await this.db.query(
      `INSERT INTO mill_lot_runs (lot_id, run_id, linked_by, linked_at) VALUES ($1, $2, $3, now()) ON CONFLICT DO NOTHING`,
      [id, runId, user.id],
    );
    return this.detail(id);
  }

  async unlinkRun(id: string, runId: string): Promise<LotDetail> {
    const l = await this.get(id);
    this.assertNotDelivered(l);
    if (await this.millBarRepo.exists({ where: { lotId: id, runId } }))
      throw new ConflictException('Bars of this lot were rolled on that run; move the bars to another lot first.');
    const r = await this.lotRunRepo.delete({ lotId: id, runId });
    if (!r.affected) throw new NotFoundException('That run is not linked to the lot.');
    return this.detail(id);
  }

  // ---- quotes --------------------------------------------------------------------------------------------

  async quotes(lotId: string): Promise<QuoteDto[]> {
    const rows = await this.lotQuoteRepo.find({ where: { lotId }, order: { number: 'DESC' } });
    const names = await this.names(rows.map((r) => r.createdBy));
    return rows.map((q) => this.quoteDto(q, names.get(q.createdBy) ?? 'unknown'));
  }

  private quoteDto(q: LotQuote, createdByName: string): QuoteDto {
    return {
      id: q.id,
      lotId: q.lotId,
      number: q.number,
      productTonnes: q.inputs.productTonnes,
      stockTonnes: q.result.stockTonnes,
      yieldLossPct: q.inputs.rates.yieldLossPct,
      engineHours: q.inputs.engineHours,
      crewHours: q.inputs.crewHours,
      crewSize: q.inputs.crewSize,
      lines: q.result.lines,
      subtotal: q.result.subtotal,
      contingency: q.result.contingency,
      margin: q.result.margin,
      total: q.result.total,
      currency: q.currency,
      notes: q.notes,
      createdByName,
      createdAt: q.createdAt.toISOString(),
      sentAt: q.sentAt?.toISOString() ?? null,
      sentTo: q.sentTo,
    };
  }

  async getQuote(quoteId: string): Promise<LotQuote> {
    const q = await this.lotQuoteRepo.findOne({ where: { id: quoteId } });
    if (!q) throw new NotFoundException('No such quote.');
    return q;
  }

  /** A quote from the site's rates (the mill's) and the lot's hours; kept as made. */
  async createQuote(lotId: string, dto: QuoteRequest, user: AuthUser, at?: Date): Promise<QuoteDto> {
    const l = await this.get(lotId);
    if (!LOT_STATUSES_OPEN_TO_QUOTES.includes(l.status))
      throw new ConflictException(
        `Lot ${l.reference} is ${label(l.status)}: its price is fixed. Quotes are made while a lot is on the slate or priced.`,
      );
    const mill = l.millId ? await this.mills.get(l.millId) : await this.mills.first();
    if (!mill) throw new ConflictException('Describe the mill and its quote rates first.');
    const rates = mill.quoteRates;
    const inputs: QuoteInputs = {
      productTonnes: dto.productTonnes ?? l.quantityTonnes,
      engineHours: dto.engineHours,
      crewHours: dto.crewHours,
      crewSize: dto.crewSize ?? rates.crewSize,
      extraFixedCosts: (dto.extraFixedCosts ?? []).map((f) => ({ label: f.label.trim(), amount: f.amount })),
      rates: { ...rates, fixedCosts: rates.fixedCosts.map((f) => ({ ...f })) },
    };
    const result = buildQuote({
      productTonnes: inputs.productTonnes,
      yieldLossFraction: rates.yieldLossPct / 100,
      stockRatePerTonne: rates.stockRatePerTonne,
      engineHours: inputs.engineHours,
      engineRatePerHour: rates.engineRatePerHour,
      crewHours: inputs.crewHours,
      crewSize: inputs.crewSize,
      crewRatePerPersonHour: rates.crewRatePerPersonHour,
      fixedCosts: [...rates.fixedCosts, ...inputs.extraFixedCosts],
      contingencyPct: rates.contingencyPct,
      marginPct: rates.marginPct,
    });
    const saved = await this.db.transaction(async (m) => {
      await m.query(`SELECT pg_advisory_xact_lock(hashtext($1))`, [`mill_quotes:${lotId}`]);
      const [{ n }] = await m.query(`SELECT COALESCE(max(number), 0)::int AS n FROM mill_quotes WHERE lot_id = $1`, [lotId]);
      return m.save(
        LotQuote,
        m.create(LotQuote, {
          lotId,
          number: n + 1,
          inputs,
          result,
          total: result.total,
          currency: rates.currency,
          notes: dto.notes ?? '',
          createdBy: user.id,
          ...(at ? { createdAt: at } : {}),
        }),
      );
    });
    return this.quoteDto(saved, user.displayName);
  }

  async quotePdf(quoteId: string, printedBy: string, printedAt = new Date()): Promise<{ filename: string; buffer: Buffer }> {
    const q = await this.getQuote(quoteId);
    const lot = await this.get(q.lotId);
    const mill = lot.millId ? await this.mills.get(lot.millId) : await this.mills.first();
    return this.pdf.render({ quote: q, lot, millName: mill?.name ?? 'The mill', printedBy, printedAt });
  }

  /** E-mails the quote as a PDF to the customer; a lot still on the slate becomes priced. */
  async sendQuote(quoteId: string, dto: SendQuoteRequest, user: AuthUser): Promise<QuoteDto> {
    const q = await this.getQuote(quoteId);
    const lot = await this.get(q.lotId);
    const latest = await this.lotQuoteRepo.findOne({ where: { lotId: lot.id }, order: { number: 'DESC' } });
    if (latest && latest.id !== q.id)
      throw new ConflictException(`Quote ${q.number} has been replaced by quote ${latest.number}; send the latest.`);
    const to = (dto.to ?? lot.customerEmail).trim().toLowerCase();
    const { filename, buffer } = await this.quotePdf(quoteId, user.displayName);
    const money = new Intl.NumberFormat('en-GB', { style: 'currency', currency: q.currency });
    const text = [
      `Dear ${lot.customerContact || lot.customerName},`,
      '',
      dto.message?.trim() || `Please find our quotation for lot ${lot.reference} attached.`,
      '',
      `${productLabel(lot.productShape, lot.productHeightMm, lot.productWidthMm)}, ${lot.steelGrade}`,
      `Quantity: ${lot.quantityTonnes} t · due ${lot.dueDate}`,
      `Total: ${money.format(q.total)} (quote ${lot.reference}/Q${q.number})`,
      '',
      `With regards,`,
      user.displayName,
    ].join('\n');
    await this.mail.send({
      to,
      subject: `Quotation ${lot.reference}/Q${q.number}: ${productLabel(lot.productShape, lot.productHeightMm, lot.productWidthMm)}`,
      text,
      attachments: [{ filename, content: buffer, contentType: 'application/pdf' }],
    });
    const now = new Date();
    await this.lotQuoteRepo.update({ id: q.id }, { sentAt: now, sentTo: to });
    if (lot.status === 'on_the_slate') await this.transition(lot.id, { to: 'priced', note: `Quote ${q.number} sent to ${to}.` }, user, now);
    const names = await this.names([q.createdBy]);
    return this.quoteDto({ ...q, sentAt: now, sentTo: to }, names.get(q.createdBy) ?? 'unknown');
  }
}
