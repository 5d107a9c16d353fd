import { inspectPdf, mangledWords, overlappingWords, pageFooters } from '../../../test/utils/pdf-inspect.js';
import { printable, recordFileName, renderRecord } from './record-document.js';
import { zonedClock } from './zoned-time.js';

// The checks use poppler-utils (pdffonts, pdftotext, pdfinfo), installed by ops/lib.sh ensure_poppler.

describe('the record layout layer', () => {
  const long = 'The gland on the crank-end stuffing box was repacked after the run, and the rod wiped clean. '.repeat(6);

  it('flows a long table across pages with its heading repeated, numbers every page and embeds every font', async () => {
    const rows = Array.from({ length: 140 }, (_, i) => [
      `${String(Math.floor(i / 2) + 8).padStart(2, '0')}:${i % 2 ? '30' : '00'}`,
      { text: (60 + i / 10).toFixed(1), original: i % 9 === 0 ? (59 + i / 10).toFixed(1) : undefined },
      i % 11 === 0 ? long : 'steady',
    ]);
    const r = await renderRecord({
      title: 'Test record \u2192 with an arrow',
      subtitle: 'A subtitle',
      works: 'Alder Forge',
      engine: 'Test engine',
      timeZone: 'Europe/London',
      printedAt: new Date('2026-08-14T08:30:00Z'),
      printedBy: 'Tess Printer',
      blocks: [
        {
          kind: 'facts',
          items: [
            { label: 'Started', value: long },
            { label: 'State', value: 'closed' },
          ],
        },
        { kind: 'heading', text: 'Readings' },
        {
          kind: 'table',
          columns: [{ head: 'Time', width: 50 }, { head: 'Steam chest, psig', width: 70, align: 'right' }, { head: 'Remark' }],
          rows,
        },
        { kind: 'box', label: 'CAUTION:', text: long },
      ],
    });
    const p = inspectPdf(r.buffer);
    expect(p.pages).toBe(r.pages);
    expect(p.pages).toBeGreaterThan(2);
    expect(pageFooters(p.text)).toEqual(Array.from({ length: p.pages }, (_, i) => `page ${i + 1} of ${p.pages}`));
    expect(p.fonts.length).toBeGreaterThan(0);
    expect(p.fonts.filter((f) => !f.embedded)).toEqual([]);
    expect(p.fonts.every((f) => /Barlow/.test(f.name))).toBe(true);
    expect(overlappingWords(p.words)).toEqual([]);
    expect(mangledWords(p.words)).toEqual([]);
    // the heading row is on every page that holds the table
    const headingPages = new Set(p.words.filter((w) => w.text === 'Remark').map((w) => w.page));
    expect(headingPages.size).toBe(p.pages);
    expect(p.info.Title).toBe('Test record to with an arrow');
    expect(p.info.Author).toBe('Alder Forge');
    expect(p.text).toContain('Printed 14 Aug 2026 09:30 BST by Tess Printer');
  });

  it('puts characters the typeface lacks into words instead of boxes', () => {
    expect(printable('running \u2192 stopped, t \u2264 5')).toBe('running to stopped, t <= 5');
    expect(printable('caf\u00e9 \u2014 \u00b0F \u00d7')).toBe('caf\u00e9 \u2014 \u00b0F \u00d7');
    expect(printable('\u4e00')).toBe('?');
  });

  it('names files stably from kind, local date and name', () => {
    expect(recordFileName('run-log', '2026-08-14', 'August demonstration: day 1')).toBe(
      'run-log-2026-08-14-august-demonstration-day-1.pdf',
    );
    expect(recordFileName('quote', null, '')).toBe('quote-record.pdf');
  });

  it('prints times in the works zone with its name, summer and winter', () => {
    const c = zonedClock('Europe/London');
    expect(c.dateTime('2026-08-14T08:30:00Z')).toBe('14 Aug 2026 09:30 BST');
    expect(c.dateTime('2026-12-04T08:30:00Z')).toBe('04 Dec 2026 08:30 GMT');
    expect(c.isoDate('2026-08-14T23:30:00Z')).toBe('2026-08-15');
    expect(zonedClock('America/New_York').time('2026-08-14T08:30:00Z')).toBe('04:30');
  });
});
