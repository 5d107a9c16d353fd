import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { PaymentKind, PaymentState } from '@crankjournal/shared-types';

/** Money asked of a customer for a lot through a hosted checkout session; amounts in minor units. */
@Entity({ name: 'payments' })
export class Payment {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'lot_id', type: 'uuid' }) lotId: string;
  @Column({ type: 'varchar', length: 16 }) kind: PaymentKind;
  @Column({ type: 'varchar', length: 16, default: 'asked' }) state: PaymentState;
  @Column({ name: 'amount_minor', type: 'int' }) amountMinor: number;
  @Column({ name: 'refunded_minor', type: 'int', default: 0 }) refundedMinor: number;
  @Column({ type: 'varchar', length: 3 }) currency: string;
  @Index({ unique: true }) @Column({ name: 'session_id', type: 'varchar', length: 255 }) sessionId: string;
  @Column({ name: 'checkout_url', type: 'text' }) checkoutUrl: string;
  @Column({ name: 'payment_intent_id', type: 'varchar', length: 255, nullable: true }) paymentIntentId: string | null;
  @Column({ name: 'emailed_to', type: 'varchar', length: 254 }) emailedTo: string;
  @Column({ name: 'decline_reason', type: 'text', nullable: true }) declineReason: string | null;
  @Column({ name: 'asked_by', type: 'uuid' }) askedBy: string;
  @CreateDateColumn({ name: 'asked_at', type: 'timestamptz' }) askedAt: Date;
  @Column({ name: 'paid_at', type: 'timestamptz', nullable: true }) paidAt: Date | null;
}

/** A refund made through the payment service. */
@Entity({ name: 'payment_refunds' })
export class PaymentRefund {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'payment_id', type: 'uuid' }) paymentId: string;
  @Index({ unique: true }) @Column({ name: 'refund_ref', type: 'varchar', length: 255 }) refundRef: string;
  @Column({ name: 'amount_minor', type: 'int' }) amountMinor: number;
  @Column({ type: 'text' }) reason: string;
  @Column({ name: 'by_user', type: 'uuid' }) byUser: string;
  @CreateDateColumn({ type: 'timestamptz' }) at: Date;
}

/** Every webhook event applied, by the payment service's event id: a replay changes nothing. */
@Entity({ name: 'payment_events' })
export class PaymentEvent {
  @Column({ name: 'event_id', type: 'varchar', length: 255, primary: true }) eventId: string;
  @Column({ type: 'varchar', length: 80 }) type: string;
  @Column({ name: 'received_at', type: 'timestamptz' }) receivedAt: Date;
}
