import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import PDFDocument from 'pdfkit';
import { zonedClock } from './zoned-time.js';

/**
 * One layout layer for every printed record. A record is a description (title, who and where, a list of blocks);
 * this file owns the page: A4 frame, header with the works and engine, footer with the time and the person who
 * printed it and "page N of M", Barlow embedded, our palette, tables that flow across pages with their heading
 * repeated, and text that always wraps inside its own box.
 */

/** Our palette (DESIGN.md, light scheme): calm greys, colour only where something needs a person. */
export const PALETTE = {
  text: '#1f2321',
  muted: '#5b605c',
  rule: '#c9c4b8',
  surface: '#eeece6',
  copper: '#2f6b5e',
  brass: '#9a7a2a',
  amber: '#a86500',
  red: '#b01e1e',
  ok: '#2f6b5e',
} as const;

/** Printed at the end of every record that bears on the engine's safety. */
export const RECORD_DISCLAIMER =
  'Crankjournal aids a qualified crew. It never replaces local boiler and pressure-vessel law, ' +
  'the insurer\u2019s inspections or licensed practice.';

export type Tone = 'normal' | 'muted' | 'warning' | 'danger' | 'ok';

/** A table cell: its text, and for an amended value the original (printed struck through under it). */
export interface Cell {
  text: string;
  original?: string;
  bold?: boolean;
  tone?: Tone;
}
export type CellInput = string | Cell;

export interface Column {
  head: string;
  /** Width in points; columns without one share what is left (in proportion to `flex`, default 1). */
  width?: number;
  flex?: number;
  align?: 'left' | 'right' | 'center';
}

export interface WriteInField {
  label: string;
  /** Share of the line's width, 0..1. */
  share: number;
}

export type Block =
  | { kind: 'heading'; text: string }
  | { kind: 'subheading'; text: string }
  | { kind: 'text'; text: string; tone?: Tone; size?: number; bold?: boolean }
  | { kind: 'facts'; items: { label: string; value: string }[]; columns?: number }
  | { kind: 'table'; columns: Column[]; rows: CellInput[][]; empty?: string; note?: string }
  | { kind: 'box'; label?: string; text: string; tone?: Tone }
  | { kind: 'writeIn'; fields: WriteInField[] }
  | { kind: 'options'; options: string[] }
  | { kind: 'item'; marker: string; tickBox: boolean; label: string; blocks: Block[] }
  | { kind: 'drawing'; height: number; draw: (doc: PDFKit.PDFDocument, box: { x: number; y: number; w: number; h: number }) => void }
  | { kind: 'space'; size?: number };

export interface RecordDocument {
  /** The record's title: printed large on page 1, in every header and as the document's title. */
  title: string;
  /** One line under the title (what the record is of). */
  subtitle?: string;
  works: string;
  engine?: string;
  /** The works' IANA time zone; every time on the record is printed in it. */
  timeZone: string;
  printedAt: Date;
  printedBy: string;
  landscape?: boolean;
  /** Keywords for the document's metadata. */
  subject?: string;
  blocks: Block[];
}

export interface RenderedRecord {
  buffer: Buffer;
  pages: number;
}

const require = createRequire(import.meta.url);
const fontFile = (pkg: string, file: string) => join(dirname(require.resolve(`${pkg}/package.json`)), 'files', file);
let fontCache: Record<string, Buffer> | null = null;
function fonts(): Record<string, Buffer> {
  fontCache ??= {
    regular: readFileSync(fontFile('@fontsource/barlow', 'barlow-latin-400-normal.woff')),
    bold: readFileSync(fontFile('@fontsource/barlow', 'barlow-latin-600-normal.woff')),
    narrow: readFileSync(fontFile('@fontsource/barlow-semi-condensed', 'barlow-semi-condensed-latin-400-normal.woff')),
    narrowBold: readFileSync(fontFile('@fontsource/barlow-semi-condensed', 'barlow-semi-condensed-latin-600-normal.woff')),
  };
  return fontCache;
}

/**
 * Characters outside the Latin subset of Barlow we ship are put into words or near equivalents, never left for
 * the viewer to draw as a box. The subset: U+0000-00FF, U+0131, U+0152-0153, U+02BB-02BC, U+02C6, U+02DA, U+02DC,
 * U+2000-206F, U+20AC, U+2122, U+2191, U+2193, U+2212, U+2215 (the package's own unicode-range).
 */
const SUBSTITUTES: Record<string, string> = {
  '\u2192': ' to ',
  '\u2190': ' from ',
  '\u2264': '<=',
  '\u2265': '>=',
  '\u2713': 'yes',
  '\u2714': 'yes',
  '\u2717': 'no',
  '\u00a0': ' ',
};
const IN_FONT =
  /[\u0020-\u007e\u00a1-\u00ff\u0131\u0152\u0153\u02bb\u02bc\u02c6\u02da\u02dc\u2010-\u2027\u2030-\u205e\u20ac\u2122\u2191\u2193\u2212\u2215\n]/u;
export function printable(s: string): string {
  let out = '';
  for (const ch of s.normalize('NFC')) {
    if (IN_FONT.test(ch)) out += ch;
    else if (SUBSTITUTES[ch] !== undefined) out += SUBSTITUTES[ch];
    else if (ch === '\t' || ch === '\r') out += ' ';
    else out += '?';
  }
  return out.replace(/ {2,}/g, ' ');
}

const TONE: Record<Tone, string> = {
  normal: PALETTE.text,
  muted: PALETTE.muted,
  warning: PALETTE.amber,
  danger: PALETTE.red,
  ok: PALETTE.ok,
};

const HEADER_H = 44;
const FOOTER_H = 34;
const SIDE = 40;
const PAD = 3;
const TABLE_SIZE = 8;
const BODY_SIZE = 9.5;

/** Renders a record description into a PDF. */
export function renderRecord(spec: RecordDocument): Promise<RenderedRecord> {
  const clock = zonedClock(spec.timeZone);
  const doc = new PDFDocument({
    size: 'A4',
    layout: spec.landscape ? 'landscape' : 'portrait',
    margins: { top: SIDE + HEADER_H, bottom: SIDE + FOOTER_H, left: SIDE, right: SIDE },
    bufferPages: true,
    autoFirstPage: true,
    pdfVersion: '1.7',
    subset: 'PDF/A-2b',
    displayTitle: true,
    lang: 'en-GB',
    info: {
      Title: printable(spec.title),
      Author: printable(spec.works),
      Subject: printable(spec.subject ?? spec.subtitle ?? spec.title),
      Creator: 'Crankjournal',
      Producer: 'Crankjournal',
      CreationDate: spec.printedAt,
      ModDate: spec.printedAt,
    },
  });
  const f = fonts();
  doc.registerFont('regular', f.regular);
  doc.registerFont('bold', f.bold);
  doc.registerFont('narrow', f.narrow);
  doc.registerFont('narrowBold', f.narrowBold);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const left = SIDE;
  const width = doc.page.width - 2 * SIDE;
  const bottom = () => doc.page.height - doc.page.margins.bottom;
  const room = (h: number) => {
    if (doc.y + h > bottom()) doc.addPage();
  };
  const setTone = (t: Tone | undefined) => doc.fillColor(TONE[t ?? 'normal']);
  const rule = (x: number, y: number, w: number, color: string = PALETTE.rule, lw = 0.5) =>
    doc
      .save()
      .moveTo(x, y)
      .lineTo(x + w, y)
      .lineWidth(lw)
      .strokeColor(color)
      .stroke()
      .restore();

  // Title block on page 1.
  doc.font('bold').fontSize(17);
  setTone('normal');
  doc.text(printable(spec.title), left, doc.y, { width });
  if (spec.subtitle) {
    doc.font('regular').fontSize(10);
    setTone('muted');
    doc.text(printable(spec.subtitle), left, doc.y + 1, { width });
  }
  doc.y += 8;

  const renderBlocks = (blocks: Block[], x: number, w: number) => {
    for (const b of blocks) renderBlock(b, x, w);
  };

  const renderBlock = (b: Block, x: number, w: number): void => {
    switch (b.kind) {
      case 'space':
        doc.y += b.size ?? 6;
        return;
      case 'heading': {
        doc.font('bold').fontSize(12);
        const h = doc.heightOfString(printable(b.text), { width: w });
        room(h + 40);
        doc.y += 6;
        setTone('normal');
        doc.fillColor(PALETTE.copper).text(printable(b.text), x, doc.y, { width: w });
        rule(x, doc.y + 1, w, PALETTE.brass, 0.8);
        doc.y += 5;
        return;
      }
      case 'subheading': {
        doc.font('bold').fontSize(10);
        const h = doc.heightOfString(printable(b.text), { width: w });
        room(h + 30);
        doc.y += 3;
        setTone('normal');
        doc.text(printable(b.text), x, doc.y, { width: w });
        doc.y += 2;
        return;
      }
      case 'text': {
        doc.font(b.bold ? 'bold' : 'regular').fontSize(b.size ?? BODY_SIZE);
        const t = printable(b.text);
        room(Math.min(doc.heightOfString(t, { width: w }), 3 * doc.currentLineHeight(true)));
        setTone(b.tone);
        doc.text(t, x, doc.y, { width: w });
        doc.y += 3;
        setTone('normal');
        return;
      }
      case 'facts': {
        const cols = b.columns ?? 2;
        const gap = 12;
        const colW = (w - gap * (cols - 1)) / cols;
        const labelW = Math.min(110, colW * 0.38);
        for (let i = 0; i < b.items.length; i += cols) {
          const row = b.items.slice(i, i + cols);
          doc.fontSize(BODY_SIZE);
          const heights = row.map((it) => {
            doc.font('bold');
            const lh = doc.heightOfString(printable(it.label), { width: labelW - 4 });
            doc.font('regular');
            return Math.max(lh, doc.heightOfString(printable(it.value || '\u2014'), { width: colW - labelW }));
          });
          const h = Math.max(...heights) + 2;
          room(h);
          const y = doc.y;
          row.forEach((it, j) => {
            const cx = x + j * (colW + gap);
            doc.font('bold').fontSize(BODY_SIZE).fillColor(PALETTE.muted);
            doc.text(printable(it.label), cx, y, { width: labelW - 4 });
            doc.font('regular').fillColor(PALETTE.text);
            doc.text(printable(it.value || '\u2014'), cx + labelW, y, { width: colW - labelW });
          });
          doc.y = y + h;
        }
        doc.y += 2;
        return;
      }
      case 'table':
        renderTable(b, x, w);
        return;
      case 'box': {
        const label = b.label ? printable(b.label) + ' ' : '';
        const t = printable(b.text);
        doc.fontSize(8.5);
        doc.font('bold');
        const lh = label ? doc.heightOfString(label, { width: w - 10 }) : 0;
        doc.font('regular');
        const th = doc.heightOfString(t, { width: w - 10 });
        const h = lh + th + 8;
        room(h + 2);
        const y = doc.y + 1;
        const colour = TONE[b.tone ?? 'warning'];
        doc.save().rect(x, y, w, h).lineWidth(0.8).strokeColor(colour).stroke().restore();
        if (label) {
          doc
            .font('bold')
            .fillColor(colour)
            .text(label, x + 5, y + 4, { width: w - 10 });
        }
        doc
          .font('regular')
          .fillColor(PALETTE.text)
          .text(t, x + 5, y + 4 + lh, { width: w - 10 });
        doc.y = y + h + 4;
        return;
      }
      case 'writeIn': {
        doc.font('regular').fontSize(BODY_SIZE);
        const lineH = 26;
        room(lineH);
        const y = doc.y;
        let cx = x;
        for (const fld of b.fields) {
          const fw = w * fld.share;
          const label = printable(fld.label);
          const lw = Math.min(doc.widthOfString(label) + 4, fw - 40);
          doc.fillColor(PALETTE.muted).text(label, cx, y + 8, { width: lw, height: doc.currentLineHeight(), ellipsis: true });
          rule(cx + lw + 2, y + 19, fw - lw - 12, PALETTE.text, 0.5);
          cx += fw;
        }
        doc.fillColor(PALETTE.text);
        doc.y = y + lineH;
        return;
      }
      case 'options': {
        doc.font('regular').fontSize(BODY_SIZE);
        const boxS = 9;
        let cx = x;
        room(16);
        let y = doc.y + 2;
        for (const o of b.options.map(printable)) {
          const ow = boxS + 4 + doc.widthOfString(o) + 14;
          if (cx + ow > x + w && cx > x) {
            cx = x;
            y += 16;
            if (y + 16 > bottom()) {
              doc.addPage();
              y = doc.y;
            }
          }
          doc
            .save()
            .rect(cx, y + 1, boxS, boxS)
            .lineWidth(0.8)
            .strokeColor(PALETTE.text)
            .stroke()
            .restore();
          doc.fillColor(PALETTE.text).text(o, cx + boxS + 4, y, { lineBreak: false });
          cx += ow;
        }
        doc.y = y + 16;
        return;
      }
      case 'item': {
        const indent = 36;
        doc.font('bold').fontSize(10);
        const label = printable(b.label);
        const lh = doc.heightOfString(label, { width: w - indent });
        room(lh + 30);
        const y = doc.y;
        doc
          .font('regular')
          .fontSize(8)
          .fillColor(PALETTE.muted)
          .text(printable(b.marker), x, y + 1, { width: 14 });
        if (b.tickBox)
          doc
            .save()
            .rect(x + 17, y, 11, 11)
            .lineWidth(0.8)
            .strokeColor(PALETTE.text)
            .stroke()
            .restore();
        doc
          .font('bold')
          .fontSize(10)
          .fillColor(PALETTE.text)
          .text(label, x + indent, y, { width: w - indent });
        doc.y = Math.max(doc.y, y + 13) + 1;
        renderBlocks(b.blocks, x + indent, w - indent);
        doc.y += 5;
        return;
      }
      case 'drawing': {
        room(b.height);
        const box = { x, y: doc.y, w, h: b.height };
        doc.save();
        b.draw(doc, box);
        doc.restore();
        doc.font('regular').fontSize(BODY_SIZE).fillColor(PALETTE.text).strokeColor(PALETTE.text).lineWidth(1);
        doc.x = x;
        doc.y = box.y + b.height;
        return;
      }
    }
  };

  const renderTable = (t: Extract<Block, { kind: 'table' }>, x: number, w: number) => {
    const fixed = t.columns.reduce((s, c) => s + (c.width ?? 0), 0);
    const flexSum = t.columns.reduce((s, c) => s + (c.width === undefined ? (c.flex ?? 1) : 0), 0);
    const widths = t.columns.map((c) => c.width ?? (Math.max(0, w - fixed) * (c.flex ?? 1)) / (flexSum || 1));
    const cellOf = (c: CellInput): Cell => (typeof c === 'string' ? { text: c } : c);
    const measure = (c: Cell, cw: number, head = false) => {
      doc.font(head || c.bold ? 'narrowBold' : 'narrow').fontSize(TABLE_SIZE);
      let h = doc.heightOfString(printable(c.text) || ' ', { width: cw - 2 * PAD });
      if (c.original !== undefined) {
        doc.font('narrow').fontSize(TABLE_SIZE - 1);
        h += doc.heightOfString(printable(c.original), { width: cw - 2 * PAD });
      }
      return h;
    };
    const drawRow = (cells: Cell[], head: boolean) => {
      const h = Math.max(...cells.map((c, i) => measure(c, widths[i], head))) + 2 * PAD;
      if (doc.y + h > bottom()) {
        doc.addPage();
        if (!head) drawRow(headCells, true);
      }
      const y = doc.y;
      if (head) doc.save().rect(x, y, w, h).fillColor(PALETTE.surface).fill().restore();
      let cx = x;
      cells.forEach((c, i) => {
        const cw = widths[i];
        const align = t.columns[i].align ?? 'left';
        doc.font(head || c.bold ? 'narrowBold' : 'narrow').fontSize(TABLE_SIZE);
        doc.fillColor(head ? PALETTE.text : TONE[c.tone ?? 'normal']);
        doc.text(printable(c.text), cx + PAD, y + PAD, { width: cw - 2 * PAD, align, features: ['tnum'] });
        if (c.original !== undefined) {
          doc
            .font('narrow')
            .fontSize(TABLE_SIZE - 1)
            .fillColor(PALETTE.muted);
          doc.text(printable(c.original), cx + PAD, doc.y, { width: cw - 2 * PAD, align, strike: true, features: ['tnum'] });
        }
        cx += cw;
      });
      rule(x, y + h, w, head ? PALETTE.muted : PALETTE.rule, head ? 0.8 : 0.4);
      doc.x = x;
      doc.y = y + h;
    };
    const headCells = t.columns.map((c) => ({ text: c.head }));
    // Keep the heading with at least its first row.
    const firstH = t.rows.length ? Math.max(...t.rows[0].map((c, i) => measure(cellOf(c), widths[i]))) + 2 * PAD : 0;
    const headH = Math.max(...headCells.map((c, i) => measure(c, widths[i], true))) + 2 * PAD;
    room(headH + firstH + 2);
    if (!t.rows.length) {
      renderBlock({ kind: 'text', text: t.empty ?? 'None.', tone: 'muted' }, x, w);
      return;
    }
    drawRow(headCells, true);
    for (const r of t.rows) drawRow(r.map(cellOf), false);
    doc.y += 3;
    if (t.note) renderBlock({ kind: 'text', text: t.note, tone: 'muted', size: 8 }, x, w);
  };

  renderBlocks(spec.blocks, left, width);

  // Header and footer on every page, now that the page count is known.
  const range = doc.bufferedPageRange();
  const total = range.count;
  for (let i = range.start; i < range.start + total; i++) {
    doc.switchToPage(i);
    const keep = doc.page.margins;
    doc.page.margins = { top: 0, bottom: 0, left: 0, right: 0 };
    const pw = doc.page.width;
    const ph = doc.page.height;
    const half = (pw - 2 * SIDE) / 2;
    doc.font('bold').fontSize(9).fillColor(PALETTE.copper);
    doc.text(printable(spec.works), SIDE, SIDE, { width: half - 6, lineBreak: false, ellipsis: true });
    doc.font('regular').fontSize(9).fillColor(PALETTE.muted);
    doc.text(printable(spec.engine ?? ''), SIDE, SIDE + 12, { width: half - 6, lineBreak: false, ellipsis: true });
    doc.text(printable(spec.title), SIDE + half + 6, SIDE, { width: half - 6, align: 'right', lineBreak: false, ellipsis: true });
    doc.text(`Times: ${spec.timeZone} local time`, SIDE + half + 6, SIDE + 12, {
      width: half - 6,
      align: 'right',
      lineBreak: false,
    });
    rule(SIDE, SIDE + 27, pw - 2 * SIDE, PALETTE.brass, 0.8);
    const fy = ph - SIDE - FOOTER_H + 12;
    rule(SIDE, fy, pw - 2 * SIDE, PALETTE.rule, 0.5);
    doc.font('regular').fontSize(8).fillColor(PALETTE.muted);
    doc.text(printable(`Printed ${clock.dateTime(spec.printedAt)} by ${spec.printedBy} \u00b7 times in ${spec.timeZone}`), SIDE, fy + 5, {
      width: pw - 2 * SIDE - 90,
      lineBreak: false,
      ellipsis: true,
    });
    doc
      .font('bold')
      .text(`page ${i - range.start + 1} of ${total}`, pw - SIDE - 88, fy + 5, { width: 88, align: 'right', lineBreak: false });
    doc.page.margins = keep;
  }
  doc.flushPages();
  doc.end();
  return done.then((buffer) => ({ buffer, pages: total }));
}

/** A file name that stays the same for the same record: kind, local date, a slug of its name. */
export function recordFileName(kind: string, localDate: string | null, name: string, ext = 'pdf'): string {
  const slug =
    name
      .normalize('NFKD')
      .replace(/[^A-Za-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .toLowerCase()
      .slice(0, 48) || 'record';
  return `${[kind, localDate, slug].filter(Boolean).join('-')}.${ext}`;
}
