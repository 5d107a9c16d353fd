import { Injectable } from '@nestjs/common';
import PDFDocument from 'pdfkit';
import { productLabel } from '@crankjournal/shared-types';
import type { CustomerLot } from './customer-lot.entity.js';
import type { LotQuote } from './lot-quote.entity.js';

/** How long a quote holds (common practice, no source). */
export const QUOTE_VALID_DAYS = 30;

const qty = (n: number) => (Number.isInteger(n) ? String(n) : n.toFixed(n < 10 ? 3 : 2));

/** The quote as a one-page PDF the mill lead can send. */
@Injectable()
export class QuotePdfService {
  render(p: { quote: LotQuote; lot: CustomerLot; millName: string }): Promise<Buffer> {
    const { quote: q, lot } = p;
    const money = new Intl.NumberFormat('en-GB', { style: 'currency', currency: q.currency });
    const doc = new PDFDocument({ size: 'A4', margin: 50, info: { Title: `Quotation ${lot.reference}/Q${q.number}`, Author: p.millName } });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    const done = new Promise<Buffer>((resolve, reject) => {
      doc.on('end', () => resolve(Buffer.concat(chunks)));
      doc.on('error', reject);
    });
    const made = q.createdAt ?? new Date();
    const validUntil = new Date(made.getTime() + QUOTE_VALID_DAYS * 86_400_000);
    const day = (d: Date) => d.toISOString().slice(0, 10);

    doc.font('Helvetica-Bold').fontSize(18).text(`Quotation ${lot.reference}/Q${q.number}`);
    doc
      .font('Helvetica')
      .fontSize(10)
      .fillColor('#444')
      .text(`${p.millName} · made ${day(made)} · valid until ${day(validUntil)}`);
    doc.moveDown(1).fillColor('#000');
    doc.font('Helvetica-Bold').fontSize(11).text('For');
    doc.font('Helvetica').fontSize(10).text(lot.customerName);
    if (lot.customerContact) doc.text(lot.customerContact);
    doc.text(lot.customerEmail);
    doc.moveDown(0.8);
    doc.font('Helvetica-Bold').fontSize(11).text('Product');
    doc.font('Helvetica').fontSize(10);
    doc.text(`${productLabel(lot.productShape, lot.productHeightMm, lot.productWidthMm)}, ${lot.steelGrade}`);
    doc.text(`Quantity ${qty(q.inputs.productTonnes)} t of product, due ${lot.dueDate}`);
    doc.text(
      `Stock ${qty(q.result.stockTonnes)} t, allowing ${q.inputs.rates.yieldLossPct} % of the stock for scale, crop ends and rejects`,
    );
    doc.moveDown(1);

    const x0 = doc.page.margins.left;
    const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
    const cols = [
      { title: 'Item', w: width * 0.4, align: 'left' as const },
      { title: 'Quantity', w: width * 0.2, align: 'right' as const },
      { title: 'Rate', w: width * 0.2, align: 'right' as const },
      { title: 'Amount', w: width * 0.2, align: 'right' as const },
    ];
    const row = (cells: string[], bold = false) => {
      const y = doc.y;
      doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(10);
      let x = x0;
      cells.forEach((c, i) => {
        doc.text(c, x, y, { width: cols[i].w - 6, align: cols[i].align });
        x += cols[i].w;
      });
      doc.moveDown(0.4);
      doc.x = x0;
    };
    const rule = () => {
      doc
        .moveTo(x0, doc.y)
        .lineTo(x0 + width, doc.y)
        .strokeColor('#999')
        .lineWidth(0.5)
        .stroke();
      doc.moveDown(0.3);
    };
    row(
      cols.map((c) => c.title),
      true,
    );
    rule();
    for (const l of q.result.lines) row([l.label, `${qty(l.quantity)} ${l.unit}`, money.format(l.rate), money.format(l.amount)]);
    rule();
    row(['Subtotal', '', '', money.format(q.result.subtotal)]);
    row([`Contingency (${q.result.contingency.quantity} %)`, '', '', money.format(q.result.contingency.amount)]);
    row([`Margin (${q.result.margin.quantity} %)`, '', '', money.format(q.result.margin.amount)]);
    rule();
    row(['Total', '', '', money.format(q.result.total)], true);
    doc.moveDown(1);
    doc.font('Helvetica').fontSize(9).fillColor('#444');
    doc.text(
      'Amounts are rounded to the penny line by line; the total is the exact total rounded, so the lines may differ from it by a penny.',
      x0,
      doc.y,
      { width },
    );
    if (q.notes) doc.moveDown(0.5).fillColor('#000').fontSize(10).text(q.notes, { width });
    doc.end();
    return done;
  }
}
