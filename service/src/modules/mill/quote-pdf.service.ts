import { Injectable } from '@nestjs/common';
import { productLabel } from '@crankjournal/shared-types';
import { renderRecord, recordFileName } from '../../common/pdf/record-document.js';
import { zonedClock } from '../../common/pdf/zoned-time.js';
import { SiteService } from '../site/site.service.js';
import type { CustomerLot } from './customer-lot.entity.js';
import type { LotQuote } from './lot-quote.entity.js';

/** How long a quote holds (common practice, no source). */
export const QUOTE_VALID_DAYS = 30;

const qty = (n: number) => (Number.isInteger(n) ? String(n) : n.toFixed(n < 10 ? 3 : 2));

/** The quote as a PDF the mill lead can send, on the records layer. */
@Injectable()
export class QuotePdfService {
  constructor(private readonly site: SiteService) {}

  async render(p: {
    quote: LotQuote;
    lot: CustomerLot;
    millName: string;
    printedBy: string;
    printedAt?: Date;
  }): Promise<{ filename: string; buffer: Buffer }> {
    const { quote: q, lot } = p;
    const site = await this.site.settings();
    const clock = zonedClock(site.timeZone);
    const money = new Intl.NumberFormat('en-GB', { style: 'currency', currency: q.currency });
    const made = q.createdAt ?? new Date();
    const validUntil = new Date(made.getTime() + QUOTE_VALID_DAYS * 86_400_000);
    const title = `Quotation ${lot.reference}/Q${q.number}`;
    const { buffer } = await renderRecord({
      title,
      subtitle: `${p.millName} \u00b7 made ${clock.date(made)} \u00b7 valid until ${clock.date(validUntil)}`,
      works: site.worksName,
      engine: p.millName,
      timeZone: site.timeZone,
      printedAt: p.printedAt ?? new Date(),
      printedBy: p.printedBy,
      subject: 'Quotation',
      blocks: [
        {
          kind: 'facts',
          columns: 1,
          items: [
            { label: 'For', value: [lot.customerName, lot.customerContact, lot.customerEmail].filter(Boolean).join('\n') },
            { label: 'Product', value: `${productLabel(lot.productShape, lot.productHeightMm, lot.productWidthMm)}, ${lot.steelGrade}` },
            { label: 'Quantity', value: `${qty(q.inputs.productTonnes)} t of product, due ${lot.dueDate}` },
            {
              label: 'Stock',
              value:
                `${qty(q.result.stockTonnes)} t, allowing ${q.inputs.rates.yieldLossPct} % ` +
                'of the stock for scale, crop ends and rejects',
            },
          ],
        },
        { kind: 'heading', text: 'Price' },
        {
          kind: 'table',
          columns: [
            { head: 'Item', flex: 2 },
            { head: 'Quantity', align: 'right' },
            { head: 'Rate', align: 'right' },
            { head: 'Amount', align: 'right' },
          ],
          rows: [
            ...q.result.lines.map((l) => [l.label, `${qty(l.quantity)} ${l.unit}`, money.format(l.rate), money.format(l.amount)]),
            ['Subtotal', '', '', money.format(q.result.subtotal)],
            [`Contingency (${q.result.contingency.quantity} %)`, '', '', money.format(q.result.contingency.amount)],
            [`Margin (${q.result.margin.quantity} %)`, '', '', money.format(q.result.margin.amount)],
            [{ text: 'Total', bold: true }, '', '', { text: money.format(q.result.total), bold: true }],
          ],
        },
        {
          kind: 'text',
          size: 8.5,
          tone: 'muted',
          text:
            'Amounts are rounded to the penny line by line; the total is the exact total rounded, ' +
            'so the lines may differ from it by a penny.',
        },
        ...(q.notes
          ? [
              { kind: 'heading' as const, text: 'Notes' },
              { kind: 'text' as const, text: q.notes },
            ]
          : []),
      ],
    });
    return { filename: recordFileName('quote', null, `${lot.reference} Q${q.number}`), buffer };
  }
}
