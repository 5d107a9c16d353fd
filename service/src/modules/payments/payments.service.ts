import { randomUUID } from 'node:crypto';
import { BadRequestException, ConflictException, Injectable, Logger, NotFoundException, type OnModuleInit } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, In, Repository } from 'typeorm';
import Stripe from 'stripe';
import {
  MONEY_ROOM,
  PAYMENT_KIND_LABELS,
  type LotDetail,
  type LotMoney,
  type OutstandingLot,
  type PaymentAskRequest,
  type PaymentDto,
  type PaymentRefundRequest,
  type PaymentWebhookAck,
} from '@crankjournal/shared-types';
import { AppConfig } from '../../config/app-config.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { amountToMinorUnits, minorUnitsToAmount, shareOfMinorUnits } from '../../calculations/money.js';
import { LotsService } from '../mill/lots.service.js';
import { MailService } from '../mail/mail.service.js';
import { LiveService } from '../live/live.service.js';
import { SiteService } from '../site/site.service.js';
import { UsersService } from '../users/users.service.js';
import { Payment, PaymentRefund } from './payment.entity.js';
import { ReceiptPdfService } from './receipt-pdf.service.js';

/** The payment service's client, pointed at PAYMENTS_API_URL (the local stand-in in development and tests). */
export function paymentClient(apiKey: string, apiUrl: string): Stripe {
  const u = new URL(apiUrl);
  const protocol = u.protocol === 'http:' ? 'http' : 'https';
  return new Stripe(apiKey, {
    host: u.hostname,
    port: Number(u.port || (protocol === 'http' ? 80 : 443)),
    protocol,
    maxNetworkRetries: 2,
    timeout: 20_000,
  });
}

/** Deposits and balances for customer lots through hosted checkout sessions, their webhooks and refunds. */
@Injectable()
export class PaymentsService implements OnModuleInit {
  private readonly log = new Logger('Payments');
  private readonly client: Stripe;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Payment) private readonly paymentRepo: Repository<Payment>,
    @InjectRepository(PaymentRefund) private readonly refundRepo: Repository<PaymentRefund>,
    private readonly config: AppConfig,
    private readonly lots: LotsService,
    private readonly mail: MailService,
    private readonly site: SiteService,
    private readonly users: UsersService,
    private readonly receipts: ReceiptPdfService,
    private readonly live: LiveService,
  ) {
    this.client = paymentClient(config.get('PAYMENTS_API_KEY'), config.get('PAYMENTS_API_URL'));
  }

  onModuleInit(): void {
    this.lots.registerRollPlanGate(async (lotId) => {
      const paid = await this.paymentRepo.exists({ where: { lotId, kind: 'deposit', state: 'paid' } });
      return paid ? null : 'The deposit for this lot is not paid.';
    });
  }

  private money(currency: string, minor: number): string {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(minorUnitsToAmount(minor, currency));
  }

  private quoted(lot: LotDetail): { minor: number; currency: string; quoteId: string } | null {
    const q = lot.quotes[0];
    return q ? { minor: amountToMinorUnits(q.total, q.currency), currency: q.currency, quoteId: q.id } : null;
  }

  /**
   * Tells the people who see money (the money room) a lot's money as it is now, on every instance (the socket
   * adapter carries room events across instances). A failure is logged: the change itself is stored already.
   */
  private async announce(lotId: string): Promise<void> {
    try {
      this.tell(await this.lotMoney(lotId));
    } catch (e) {
      this.log.warn(`live money of lot ${lotId}: ${e instanceof Error ? e.message : String(e)}`);
    }
  }

  private tell(m: LotMoney): LotMoney {
    this.live.emitToRoom(MONEY_ROOM, 'lot:money', m);
    return m;
  }

  async lotMoney(lotId: string): Promise<LotMoney> {
    const lot = await this.lots.detail(lotId);
    const site = await this.site.settings();
    const rows = await this.paymentRepo.find({ where: { lotId }, order: { askedAt: 'ASC' } });
    const refunds = rows.length
      ? await this.refundRepo.find({ where: { paymentId: In(rows.map((r) => r.id)) }, order: { at: 'ASC' } })
      : [];
    const names = await this.users.displayNames([...rows.map((r) => r.askedBy), ...refunds.map((r) => r.byUser)]);
    const q = this.quoted(lot);
    const paid = rows.filter((r) => r.state === 'paid');
    const paidMinor = paid.reduce((a, r) => a + r.amountMinor, 0);
    const refundedMinor = paid.reduce((a, r) => a + r.refundedMinor, 0);
    const payments: PaymentDto[] = rows.map((r) => ({
      id: r.id,
      lotId: r.lotId,
      kind: r.kind,
      state: r.state,
      amountMinor: r.amountMinor,
      refundedMinor: r.refundedMinor,
      currency: r.currency,
      checkoutUrl: r.state === 'asked' ? r.checkoutUrl : null,
      emailedTo: r.emailedTo,
      askedByName: names.get(r.askedBy) ?? 'unknown',
      askedAt: r.askedAt.toISOString(),
      paidAt: r.paidAt?.toISOString() ?? null,
      declineReason: r.state === 'asked' ? r.declineReason : null,
      refunds: refunds
        .filter((f) => f.paymentId === r.id)
        .map((f) => ({
          id: f.id,
          amountMinor: f.amountMinor,
          reason: f.reason,
          byName: names.get(f.byUser) ?? 'unknown',
          at: f.at.toISOString(),
        })),
    }));
    return {
      lotId,
      reference: lot.reference,
      currency: q?.currency ?? lot.currency,
      quotedMinor: q?.minor ?? null,
      depositSharePct: site.depositSharePct,
      askedMinor: rows.filter((r) => r.state === 'asked').reduce((a, r) => a + r.amountMinor, 0),
      paidMinor,
      refundedMinor,
      dueMinor: Math.max(0, (q?.minor ?? 0) - paidMinor + refundedMinor),
      depositPaid: paid.some((r) => r.kind === 'deposit'),
      settled: paid.some((r) => r.kind === 'balance'),
      payments,
    };
  }

  /** Lots with money still to come: ordered onwards, not settled. */
  async outstanding(): Promise<OutstandingLot[]> {
    const lots = (await this.lots.list({})).filter((l) => !['on_the_slate', 'priced'].includes(l.status) && l.latestQuoteTotal !== null);
    const out: OutstandingLot[] = [];
    for (const l of lots) {
      const m = await this.lotMoney(l.id);
      if (m.settled || m.dueMinor <= 0 || m.quotedMinor === null) continue;
      out.push({
        lotId: l.id,
        reference: l.reference,
        customerName: l.customerName,
        currency: m.currency,
        quotedMinor: m.quotedMinor,
        paidMinor: m.paidMinor - m.refundedMinor,
        dueMinor: m.dueMinor,
        askedKind: m.payments.find((p) => p.state === 'asked')?.kind ?? null,
      });
    }
    return out;
  }

  /** Asks the customer for a deposit or the balance: a checkout session, then an e-mail with its link and the quote. */
  async ask(lotId: string, dto: PaymentAskRequest, user: AuthUser): Promise<LotMoney> {
    const lot = await this.lots.detail(lotId);
    const q = this.quoted(lot);
    if (!q) throw new ConflictException(`Lot ${lot.reference} has no quote yet: make and send a quote before asking for money.`);
    const now = await this.lotMoney(lotId);
    const open = now.payments.find((p) => p.state === 'asked');
    if (open)
      throw new ConflictException(
        `A ${PAYMENT_KIND_LABELS[open.kind].toLowerCase()} of ${this.money(open.currency, open.amountMinor)} ` +
          'is already asked of the customer; ' +
          'wait for it to be paid.',
      );
    let amountMinor: number;
    if (dto.kind === 'deposit') {
      if (dto.adjustmentMinor !== undefined)
        throw new BadRequestException('adjustmentMinor is for a balance; a deposit takes sharePct or amountMinor.');
      if (!['priced', 'ordered'].includes(lot.status))
        throw new ConflictException(
          `Lot ${lot.reference} is ${lot.status}: a deposit is asked once the quote is sent and before the roll plan.`,
        );
      if (now.depositPaid) throw new ConflictException(`The deposit for lot ${lot.reference} is paid already.`);
      amountMinor = dto.amountMinor ?? shareOfMinorUnits(q.minor, dto.sharePct ?? now.depositSharePct);
      if (amountMinor > q.minor)
        throw new BadRequestException(`A deposit cannot be more than the quote, ${this.money(q.currency, q.minor)}.`);
    } else {
      if (dto.sharePct !== undefined)
        throw new BadRequestException('sharePct is for a deposit; a balance takes amountMinor or adjustmentMinor.');
      if (lot.status !== 'dispatched')
        throw new ConflictException(`Lot ${lot.reference} is ${lot.status}: the balance is asked after dispatch.`);
      if (now.settled) throw new ConflictException(`Lot ${lot.reference} is settled: its balance is paid.`);
      amountMinor = dto.amountMinor ?? now.dueMinor + (dto.adjustmentMinor ?? 0);
    }
    if (!(amountMinor > 0)) throw new BadRequestException('The amount to ask must be more than nothing.');
    const to = (dto.to ?? lot.customerEmail).trim().toLowerCase();
    const id = randomUUID();
    const what = `${PAYMENT_KIND_LABELS[dto.kind]} for lot ${lot.reference}`;
    const base = this.config.get('PUBLIC_URL').replace(/\/$/, '');
    const metadata = { paymentId: id, lotId, kind: dto.kind };
    const session = await this.client.checkout.sessions
      .create(
        {
          mode: 'payment',
          customer_email: to,
          client_reference_id: lotId,
          success_url: `${base}/api/payments/thanks?session={CHECKOUT_SESSION_ID}`,
          cancel_url: `${base}/api/payments/thanks`,
          line_items: [
            { quantity: 1, price_data: { currency: q.currency.toLowerCase(), unit_amount: amountMinor, product_data: { name: what } } },
          ],
          metadata,
          payment_intent_data: { metadata },
        },
        { idempotencyKey: `payment-${id}` },
      )
      .catch((e: unknown) => this.unreachable(e));
    if (!session.url) throw new ConflictException('The payment service made no checkout page; try again.');
    await this.paymentRepo.insert({
      id,
      lotId,
      kind: dto.kind,
      state: 'asked',
      amountMinor,
      currency: q.currency,
      sessionId: session.id,
      checkoutUrl: session.url,
      emailedTo: to,
      askedBy: user.id,
    });
    const { filename, buffer } = await this.lots.quotePdf(q.quoteId, user.displayName);
    await this.mail.send({
      to,
      subject: `${what}: ${this.money(q.currency, amountMinor)}`,
      text: [
        `Dear ${lot.customerContact || lot.customerName},`,
        '',
        dto.kind === 'deposit'
          ? `Thank you for your order. To put lot ${lot.reference} on our roll plan ` +
            `we ask a deposit of ${this.money(q.currency, amountMinor)}.`
          : `Lot ${lot.reference} has been dispatched. The balance of ${this.money(q.currency, amountMinor)} is now due.`,
        '',
        `Pay on the payment service's secure page: ${session.url}`,
        '',
        `Our quotation is attached (quote total ${this.money(q.currency, q.minor)}).`,
        '',
        'With regards,',
        user.displayName,
      ].join('\n'),
      attachments: [{ filename, content: buffer, contentType: 'application/pdf' }],
    });
    return this.tell(await this.lotMoney(lotId));
  }

  private unreachable(e: unknown): never {
    this.log.warn(`payment service: ${e instanceof Error ? e.message : String(e)}`);
    if (e instanceof Stripe.errors.StripeInvalidRequestError) throw new ConflictException(`The payment service refused: ${e.message}`);
    throw new ConflictException('The payment service could not be reached or refused the request; nothing was charged. Try again.');
  }

  /** A refund (all or part of what is left of a paid payment), by the administrator with a reason. */
  async refund(paymentId: string, dto: PaymentRefundRequest, user: AuthUser): Promise<LotMoney> {
    const p = await this.paymentRepo.findOne({ where: { id: paymentId } });
    if (!p) throw new NotFoundException('No such payment.');
    if (p.state !== 'paid' || !p.paymentIntentId) throw new ConflictException('Only a paid payment can be refunded.');
    const left = p.amountMinor - p.refundedMinor;
    const amount = dto.amountMinor ?? left;
    if (left <= 0) throw new ConflictException('This payment is refunded in full already.');
    if (amount > left) throw new BadRequestException(`At most ${this.money(p.currency, left)} is left to refund on this payment.`);
    const refund = await this.client.refunds
      .create(
        { payment_intent: p.paymentIntentId, amount, reason: 'requested_by_customer', metadata: { paymentId, lotId: p.lotId } },
        // The same refund asked twice (a double click) is the same key: the payment service makes one.
        { idempotencyKey: `refund-${paymentId}-${p.refundedMinor}-${amount}` },
      )
      .catch((e: unknown) => this.unreachable(e));
    await this.db.transaction(async (m) => {
      const added: { id: string }[] = await m.query(
        `INSERT INTO payment_refunds (payment_id, refund_ref, amount_minor, reason, by_user) VALUES ($1, $2, $3, $4, $5)
         ON CONFLICT (refund_ref) DO NOTHING RETURNING id`,
        [paymentId, refund.id, refund.amount, dto.reason.trim(), user.id],
      );
      if (added.length) await m.query(`UPDATE payments SET refunded_minor = refunded_minor + $2 WHERE id = $1`, [paymentId, refund.amount]);
    });
    return this.tell(await this.lotMoney(p.lotId));
  }

  /** A signed event from the payment service: verified, applied once per event id, in any order. */
  async webhook(raw: Buffer | undefined, signature: string | undefined): Promise<PaymentWebhookAck> {
    if (!Buffer.isBuffer(raw) || !signature)
      throw new BadRequestException('A payment event needs its body and its Stripe-Signature header.');
    let event: Stripe.Event;
    try {
      event = this.client.webhooks.constructEvent(raw, signature, this.config.get('PAYMENTS_WEBHOOK_SECRET'));
    } catch {
      throw new BadRequestException('The payment event is not signed with our webhook secret (or is too old); nothing was changed.');
    }
    const after: (() => Promise<void>)[] = [];
    /** Lots whose money changed without a payment (a declined card, an expired page): told at once after the commit. */
    const changed = new Set<string>();
    const applied = await this.db.transaction(async (m) => {
      const first: unknown[] = await m.query(
        `INSERT INTO payment_events (event_id, type, received_at) VALUES ($1, $2, now()) ON CONFLICT DO NOTHING RETURNING event_id`,
        [event.id, event.type],
      );
      if (!first.length) return false;
      const at = new Date(event.created * 1000);
      if (event.type === 'checkout.session.completed' && event.data.object.payment_status === 'paid') {
        const s = event.data.object;
        const p = await m.findOne(Payment, { where: { sessionId: s.id }, lock: { mode: 'pessimistic_write' } });
        if (p && p.state === 'asked') {
          const intent = typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null);
          await m.update(Payment, { id: p.id }, { state: 'paid', paidAt: at, paymentIntentId: intent, declineReason: null });
          after.push(() => this.afterPaid({ ...p, state: 'paid', paidAt: at, paymentIntentId: intent }));
        }
      } else if (event.type === 'payment_intent.payment_failed') {
        const pi = event.data.object;
        const p = pi.metadata?.paymentId
          ? await m.findOne(Payment, { where: { id: pi.metadata.paymentId }, lock: { mode: 'pessimistic_write' } })
          : null;
        if (p && p.state === 'asked') {
          const err = pi.last_payment_error;
          const reason = [err?.message ?? 'The payment failed.', err?.decline_code ?? err?.code].filter(Boolean).join(' ');
          await m.update(Payment, { id: p.id }, { declineReason: reason });
          changed.add(p.lotId);
        }
      } else if (event.type === 'checkout.session.expired') {
        const p = await m.findOne(Payment, { where: { sessionId: event.data.object.id }, lock: { mode: 'pessimistic_write' } });
        if (p && p.state === 'asked') {
          await m.update(Payment, { id: p.id }, { state: 'cancelled' });
          changed.add(p.lotId);
        }
      }
      return true;
    });
    for (const lotId of changed) await this.announce(lotId);
    for (const f of after) await f().catch((e: unknown) => this.log.warn(`after a payment: ${e instanceof Error ? e.message : String(e)}`));
    return { received: true, applied };
  }

  private async afterPaid(p: Payment): Promise<void> {
    const lot = await this.lots.detail(p.lotId);
    try {
      if (p.kind === 'deposit')
        await this.lots.acceptOnDeposit(
          p.lotId,
          p.askedBy,
          p.paidAt ?? new Date(),
          `Deposit of ${this.money(p.currency, p.amountMinor)} paid.`,
        );
    } finally {
      // Live before the receipt is drawn and e-mailed: the lot page shows the payment as soon as the lot has moved on.
      await this.announce(p.lotId);
    }
    const { filename, buffer } = await this.receipts.render({ payment: p, lot });
    await this.mail.send({
      to: p.emailedTo,
      subject: `Receipt: ${PAYMENT_KIND_LABELS[p.kind].toLowerCase()} for lot ${lot.reference}, ${this.money(p.currency, p.amountMinor)}`,
      text: [
        `Dear ${lot.customerContact || lot.customerName},`,
        '',
        `We have received your ${PAYMENT_KIND_LABELS[p.kind].toLowerCase()} of ${this.money(p.currency, p.amountMinor)} ` +
          `for lot ${lot.reference}. ` +
          'Thank you. The receipt is attached.',
      ].join('\n'),
      attachments: [{ filename, content: buffer, contentType: 'application/pdf' }],
    });
  }
}
