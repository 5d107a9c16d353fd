/** Money for a customer lot: a deposit asked when the quote is accepted, the balance after dispatch. */
export const PAYMENT_KINDS = ['deposit', 'balance'] as const;
export type PaymentKind = (typeof PAYMENT_KINDS)[number];
export const PAYMENT_KIND_LABELS: Record<PaymentKind, string> = { deposit: 'Deposit', balance: 'Balance' };

/** asked: the customer has the link (a declined card leaves it asked, with the reason); paid; cancelled. */
export const PAYMENT_STATES = ['asked', 'paid', 'cancelled'] as const;
export type PaymentState = (typeof PAYMENT_STATES)[number];
export const PAYMENT_STATE_LABELS: Record<PaymentState, string> = { asked: 'Asked', paid: 'Paid', cancelled: 'Cancelled' };

/** A refund of (part of) a paid payment, by the administrator with a reason. */
export interface RefundDto {
  id: string;
  /** Minor units (pence, cents) of the payment's currency. */
  amountMinor: number;
  reason: string;
  byName: string;
  at: string;
}

export interface PaymentDto {
  id: string;
  lotId: string;
  kind: PaymentKind;
  state: PaymentState;
  /** Minor units (pence, cents). */
  amountMinor: number;
  refundedMinor: number;
  /** ISO 4217 code, e.g. GBP. */
  currency: string;
  /** The hosted checkout page the customer was sent; null once paid or cancelled. */
  checkoutUrl: string | null;
  emailedTo: string;
  askedByName: string;
  askedAt: string;
  paidAt: string | null;
  /** Why the last attempt to pay failed (a declined card), while still asked. */
  declineReason: string | null;
  refunds: RefundDto[];
}

/** GET /api/payments/lots/:id: a lot's money, in minor units of its currency. */
export interface LotMoney {
  lotId: string;
  reference: string;
  currency: string;
  /** The latest quote's total, or null before a quote. */
  quotedMinor: number | null;
  /** The share of the quote asked as a deposit by default (site setting), percent. */
  depositSharePct: number;
  askedMinor: number;
  paidMinor: number;
  refundedMinor: number;
  /** Quoted less paid plus refunded (never below 0); what the customer still owes. */
  dueMinor: number;
  depositPaid: boolean;
  /** The balance is paid. */
  settled: boolean;
  payments: PaymentDto[];
}

/** POST /api/payments/lots/:id/requests: ask the customer for money (mill lead, administrator). */
export interface PaymentAskRequest {
  kind: PaymentKind;
  /** A fixed sum in minor units; without it a deposit is the site's share of the quote, a balance what is due. */
  amountMinor?: number;
  /** Deposit only: a share of the quote other than the site's, percent. */
  sharePct?: number;
  /** Balance only: agreed changes, plus or minus, in minor units. */
  adjustmentMinor?: number;
  /** Defaults to the lot's customer e-mail. */
  to?: string;
}

/** POST /api/payments/:id/refunds (administrator). */
export interface PaymentRefundRequest {
  /** Minor units; the whole paid amount not yet refunded when left out. */
  amountMinor?: number;
  reason: string;
}

/** GET /api/payments/outstanding (administrator): lots with money still to come. */
export interface OutstandingLot {
  lotId: string;
  reference: string;
  customerName: string;
  currency: string;
  quotedMinor: number;
  paidMinor: number;
  dueMinor: number;
  /** The open ask, if any. */
  askedKind: PaymentKind | null;
}

/** The webhook's answer to the payment service. */
export interface PaymentWebhookAck {
  received: true;
  /** false when the event id had been seen before (nothing changed). */
  applied: boolean;
}
