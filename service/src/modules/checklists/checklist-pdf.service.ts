import { PassThrough, type Readable } from 'node:stream';
import { Injectable } from '@nestjs/common';
import PDFDocument from 'pdfkit';
import {
  CHECKLIST_PURPOSE_LABELS,
  CHECKLIST_REQUIRED_WHEN_LABELS,
  DUTY_LABELS,
  HAZARD_LABELS,
  type ChecklistItemDef,
} from '@crankjournal/shared-types';
import { EnginesService } from '../engines/engines.service.js';
import { ChecklistTemplatesService } from './checklist-templates.service.js';
import { rangeText, unitText } from './checklist-rules.js';

export const CHECKLIST_SAFETY_NOTE =
  'Crankjournal aids a qualified crew. It never replaces local boiler and pressure-vessel law, ' +
  'the insurer’s inspections or licensed practice. ' +
  'Lock out the engine before working on it.';

const BOX = 11;

/** A printable blank checklist of a template version, for the day the tablet fails. */
@Injectable()
export class ChecklistPdfService {
  constructor(
    private readonly templates: ChecklistTemplatesService,
    private readonly engines: EnginesService,
  ) {}

  async blank(templateId: string, version?: number): Promise<{ filename: string; stream: Readable }> {
    const t = await this.templates.get(templateId);
    const wanted = version ?? t.currentVersion;
    const published = wanted > 0 ? await this.templates.versionRow(templateId, wanted) : null;
    const content = published?.content ?? t.draft!;
    const engine = await this.engines.get(t.engineId);
    const doc = new PDFDocument({ size: 'A4', margin: 42, info: { Title: `${content.name} — blank checklist`, Author: 'Crankjournal' } });
    const out = new PassThrough();
    doc.pipe(out);
    const left = doc.page.margins.left;
    const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
    const bottom = () => doc.page.height - doc.page.margins.bottom;
    const room = (h: number) => {
      if (doc.y + h > bottom()) doc.addPage();
    };
    const box = (x: number, y: number) => doc.rect(x, y, BOX, BOX).lineWidth(0.8).stroke();
    const line = (x: number, y: number, w: number) =>
      doc
        .moveTo(x, y)
        .lineTo(x + w, y)
        .lineWidth(0.5)
        .stroke();

    doc.font('Helvetica-Bold').fontSize(17).text(`${content.name} — ${engine.name}`, left, doc.y, { width });
    doc.font('Helvetica').fontSize(9.5).fillColor('#333');
    const versionText = published
      ? `Version ${published.version}, published ${published.publishedAt.toISOString().slice(0, 10)}`
      : 'DRAFT — not published';
    doc.text(
      `${versionText} · ` +
        `${CHECKLIST_PURPOSE_LABELS[content.purpose]} · ${CHECKLIST_REQUIRED_WHEN_LABELS[content.requiredWhen]} · ` +
        `the signer must hold a current ${DUTY_LABELS[content.requiredDuty].toLowerCase()} qualification for this engine.`,
      { width },
    );
    doc.fillColor('black').moveDown(0.6);
    const y0 = doc.y;
    doc.fontSize(10).text('Run:', left, y0);
    line(left + 28, y0 + 10, 200);
    doc.text('Date:', left + 250, y0);
    line(left + 280, y0 + 10, 90);
    doc.text('Started (time):', left + 385, y0);
    line(left + 455, y0 + 10, width - 455);
    doc.x = left;
    doc.y = y0 + 22;
    if (content.description) doc.fontSize(10).text(content.description, left, doc.y, { width }).moveDown(0.4);
    doc
      .fontSize(8.5)
      .fillColor('#555')
      .text(
        'Paper copy for when the tablet is not available. Enter every value into Crankjournal afterwards; ' +
          'the start gate only counts checklists signed there.',
        left,
        doc.y,
        { width },
      );
    doc.fillColor('black').moveDown(0.6);

    let n = 0;
    for (const s of content.sections) {
      room(50);
      doc.font('Helvetica-Bold').fontSize(12).text(s.title, left, doc.y, { width });
      line(left, doc.y + 1, width);
      doc.moveDown(0.4);
      for (const it of s.items) {
        n++;
        this.item(doc, it, n, left, width, room, box, line);
      }
      doc.moveDown(0.4);
    }

    room(150);
    doc
      .moveDown(0.6)
      .font('Helvetica-Bold')
      .fontSize(11)
      .text('Out-of-range values accepted by the chief engineer', left, doc.y, { width });
    doc
      .font('Helvetica')
      .fontSize(9)
      .text('Item, value, reason:', left, doc.y + 4);
    for (let i = 0; i < 2; i++) line(left, doc.y + 14 + i * 18, width);
    doc.y += 44;
    doc.text('Chief engineer (name and signature):', left, doc.y);
    line(left + 175, doc.y, width - 175);
    doc.moveDown(1.4).font('Helvetica-Bold').fontSize(11).text('Signature', left, doc.y, { width });
    doc.font('Helvetica').fontSize(9.5);
    const ys = doc.y + 6;
    doc.text('Signed by (name):', left, ys);
    line(left + 85, ys + 10, 170);
    doc.text('Signature:', left + 270, ys);
    line(left + 320, ys + 10, width - 320);
    doc.text('Date and time:', left, ys + 24);
    line(left + 85, ys + 34, 170);
    doc.text('Qualification current (checked by):', left + 270, ys + 24);
    line(left + 430, ys + 34, width - 430);
    doc.x = left;
    doc.y = ys + 52;
    doc.fontSize(8).fillColor('#555').text(CHECKLIST_SAFETY_NOTE, left, doc.y, { width });
    doc.end();
    const slug =
      content.name
        .replace(/[^A-Za-z0-9]+/g, '-')
        .replace(/^-|-$/g, '')
        .slice(0, 40) || 'checklist';
    return { filename: `checklist-${slug}-v${published?.version ?? 'draft'}.pdf`, stream: out };
  }

  private item(
    doc: PDFKit.PDFDocument,
    it: ChecklistItemDef,
    n: number,
    left: number,
    width: number,
    room: (h: number) => void,
    box: (x: number, y: number) => void,
    line: (x: number, y: number, w: number) => void,
  ) {
    const textX = left + 40;
    const textW = width - 40;
    const estimate = 34 + (it.help ? 12 : 0) + (it.caution ? 26 : 0) + (it.kind === 'note' ? 30 : 0);
    room(estimate);
    const y = doc.y;
    doc
      .font('Helvetica')
      .fontSize(8)
      .fillColor('#666')
      .text(String(n), left, y + 1, { width: 14 });
    doc.fillColor('black');
    if (it.kind === 'tick') box(left + 20, y);
    doc
      .font('Helvetica-Bold')
      .fontSize(10)
      .text(`${it.label}${it.required ? '' : ' (optional)'}`, textX, y, { width: textW });
    doc.font('Helvetica').fontSize(8.5);
    if (it.help) doc.fillColor('#444').text(it.help, textX, doc.y, { width: textW }).fillColor('black');
    if (it.kind === 'reading') {
      const yy = doc.y + 4;
      doc.fontSize(9.5).text('Reading:', textX, yy);
      line(textX + 45, yy + 10, 90);
      doc.text(unitText(it.unit), textX + 140, yy);
      const r = rangeText(it);
      if (r)
        doc
          .font('Helvetica-Bold')
          .text(`Acceptance range: ${r}`, textX + 200, yy)
          .font('Helvetica');
      doc.x = textX;
      doc.y = yy + 16;
    } else if (it.kind === 'choice') {
      const yy = doc.y + 4;
      let x = textX;
      for (const ch of it.choices ?? []) {
        box(x, yy);
        doc.fontSize(9.5).text(ch, x + BOX + 4, yy, { lineBreak: false });
        x += BOX + 12 + doc.widthOfString(ch);
        if (x > left + width - 80) break;
      }
      doc.x = textX;
      doc.y = yy + 16;
      if (it.acceptable?.length) doc.fontSize(8.5).text(`Acceptable: ${it.acceptable.join(', ')}.`, textX, doc.y, { width: textW });
    } else if (it.kind === 'note') {
      const yy = doc.y + 4;
      line(textX, yy + 12, textW);
      line(textX, yy + 28, textW);
      doc.y = yy + 34;
    } else if (it.kind === 'photo') {
      const yy = doc.y + 4;
      box(textX, yy);
      doc.fontSize(9.5).text('Photo taken (add it in Crankjournal afterwards)', textX + BOX + 4, yy);
      doc.x = textX;
      doc.y = yy + 16;
    }
    if (it.caution) {
      const yy = doc.y + 2;
      const label = `CAUTION — ${HAZARD_LABELS[it.caution.hazard]}: `;
      const h = doc.heightOfString(label + it.caution.text, { width: textW - 10 }) + 8;
      doc.rect(textX, yy, textW, h).lineWidth(0.8).stroke();
      doc
        .font('Helvetica-Bold')
        .fontSize(8.5)
        .text(label, textX + 5, yy + 4, { continued: true, width: textW - 10 })
        .font('Helvetica')
        .text(it.caution.text);
      doc.y = yy + h + 2;
    }
    doc.x = left;
    doc.moveDown(0.5);
  }
}
