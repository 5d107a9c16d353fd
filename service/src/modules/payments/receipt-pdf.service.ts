import { Injectable } from '@nestjs/common';
import { PAYMENT_KIND_LABELS, productLabel, type LotDetail } from '@crankjournal/shared-types';
import { renderRecord, recordFileName } from '../../common/pdf/record-document.js';
import { zonedClock } from '../../common/pdf/zoned-time.js';
import { minorUnitsToAmount } from '../../calculations/money.js';
import { SiteService } from '../site/site.service.js';
import type { Payment } from './payment.entity.js';

/** "British Pound" for GBP: the currency's English name, beside its code. */
const currencyName = (code: string) => new Intl.DisplayNames(['en-GB'], { type: 'currency' }).of(code) ?? code;

/** A receipt for a payment received, on the records layer; e-mailed to the customer. */
@Injectable()
export class ReceiptPdfService {
  constructor(private readonly site: SiteService) {}

  async render(p: { payment: Payment; lot: LotDetail; printedAt?: Date }): Promise<{ filename: string; buffer: Buffer }> {
    const { payment, lot } = p;
    const site = await this.site.settings();
    const clock = zonedClock(site.timeZone);
    const money = (minor: number) =>
      new Intl.NumberFormat('en-GB', { style: 'currency', currency: payment.currency }).format(minorUnitsToAmount(minor, payment.currency));
    const kind = PAYMENT_KIND_LABELS[payment.kind];
    const { buffer } = await renderRecord({
      title: `Receipt: ${kind.toLowerCase()} for lot ${lot.reference}`,
      subtitle: `received ${clock.dateTime(payment.paidAt ?? new Date())}`,
      works: site.worksName,
      engine: 'The mill',
      timeZone: site.timeZone,
      printedAt: p.printedAt ?? new Date(),
      printedBy: site.worksName,
      subject: 'Receipt',
      blocks: [
        {
          kind: 'facts',
          columns: 1,
          items: [
            { label: 'From', value: [lot.customerName, lot.customerContact, lot.customerEmail].filter(Boolean).join('\n') },
            {
              label: 'For',
              value: `Lot ${lot.reference}: ${productLabel(lot.productShape, lot.productHeightMm, lot.productWidthMm)}, ${lot.steelGrade}`,
            },
            { label: kind, value: money(payment.amountMinor) },
            { label: 'Currency', value: `${payment.currency} (${currencyName(payment.currency)})` },
            { label: 'Paid through', value: 'the payment service (card payment on its own page)' },
            { label: 'Payment reference', value: payment.paymentIntentId ?? payment.sessionId },
          ],
        },
      ],
    });
    return { filename: recordFileName('receipt', null, `${lot.reference} ${payment.kind}`), buffer };
  }
}
