import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import type { Test } from 'supertest';
import { seedDemo } from '../src/database/seeds/seed-demo.js';
import { RunLogSheetService } from '../src/modules/records/run-log-sheet.service.js';
import { ChecklistPdfService } from '../src/modules/checklists/checklist-pdf.service.js';
import { BearingHistoryExportsService } from '../src/modules/maintenance/bearing-history-exports.service.js';
import { LotsService } from '../src/modules/mill/lots.service.js';
import { ReceiptPdfService } from '../src/modules/payments/receipt-pdf.service.js';
import type { Payment } from '../src/modules/payments/payment.entity.js';
import { compareWithGolden, inspectPdf, mangledWords, overlappingWords, pageFooters, type PdfInspection } from './utils/pdf-inspect.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { startTestApp, applyTestEnv, clusterAdminConfig, type TestApp } from './utils/test-app.js';

/**
 * Every kind of printed record, rendered from the demo data (the real seed, in a database of its own so the
 * other e2e files keep theirs), checked with poppler-utils (ops/lib.sh ensure_poppler) and against a golden
 * image of one page. Goldens: test/printed-records/*.png; after an intended layout change, run this file once
 * with UPDATE_GOLDENS=1 and look at the new images before committing them.
 */
const here = dirname(fileURLToPath(import.meta.url));
const golden = (name: string) => join(here, 'printed-records', `${name}.png`);
/** Share of pixels of a 50 dpi page that may differ from its golden (anti-aliasing, seed dates of "today"). */
const GOLDEN_TOLERANCE = 0.01;
const PRINTED_AT = new Date('2026-12-04T09:15:00Z');
const PRINTED_BY = 'Golden Printer';

const binary = (req: Test) =>
  req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });

/** The checks every record must pass. */
function expectClean(p: PdfInspection, pages: number) {
  expect(p.pages).toBe(pages);
  expect(p.fonts.length).toBeGreaterThan(0);
  expect(p.fonts.filter((f) => !f.embedded)).toEqual([]);
  expect(overlappingWords(p.words)).toEqual([]);
  expect(mangledWords(p.words)).toEqual([]);
  expect(pageFooters(p.text)).toEqual(Array.from({ length: p.pages }, (_, i) => `page ${i + 1} of ${p.pages}`));
  expect(p.text).toContain('Times: Europe/London');
  expect(p.info.Author).toBe('Alder Forge');
}

describe('printed records from the demo data', () => {
  let t: TestApp;
  let admin: SignedIn;
  let chief: SignedIn;
  let observer: SignedIn;
  let augustRunId: string;

  beforeAll(async () => {
    applyTestEnv();
    // A database of its own, made through the cluster's superuser (its generated password, as ops/lib.sh sets it up).
    const url = new URL(process.env.DATABASE_URL!);
    const name = `${url.pathname.slice(1)}_records`;
    const su = new pg.Client(clusterAdminConfig(url.toString()));
    await su.connect();
    await su.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await su.query(`CREATE DATABASE ${name} OWNER ${url.username}`);
    await su.end();
    url.pathname = `/${name}`;
    process.env.DATABASE_URL = url.toString();
    t = await startTestApp();
    await seedDemo(t.app);
    admin = await login(t, 'administrator');
    chief = await login(t, 'chief_engineer');
    observer = await login(t, 'observer');
    const [run] = await t.db.query(`SELECT id FROM runs WHERE title = 'August demonstration'`);
    augustRunId = run.id;
  }, 300_000);

  afterAll(async () => {
    await t?.close();
  });

  it('the works sets its name and time zone (administrator only; an unknown zone is a 400 that says what to give)', async () => {
    const denied = await signedIn(t, chief).put('/api/site/settings').send({ timeZone: 'Europe/London' });
    expect(denied.status).toBe(403);
    const bad = await signedIn(t, admin).put('/api/site/settings').send({ timeZone: 'Mars/Olympus' });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toContain('Europe/London');
    const ok = await signedIn(t, admin)
      .put('/api/site/settings')
      .send({ worksName: 'Alder Forge', timeZone: 'Europe/London', wetSignature: true });
    expect(ok.status).toBe(200);
    const read = await signedIn(t, observer).get('/api/site/settings');
    expect(read.body).toEqual({ worksName: 'Alder Forge', timeZone: 'Europe/London', wetSignature: true, depositSharePct: 30 });
  });

  it('the run log sheet of a run with amendments, alarms, checklists and card sets shows each of them, in local time', async () => {
    // Two half-hour rows amended, as a crew correcting misread gauges would.
    const rows: { id: string; value: number }[] = await t.db.query(
      `SELECT r.id, r.value FROM readings r JOIN measurement_points p ON p.id = r.point_id
        WHERE r.run_id = $1 ORDER BY r.taken_at, p.sequence LIMIT 2 OFFSET 40`,
      [augustRunId],
    );
    // The run is closed, so the API refuses new amendments (409): the record is written as the API would have written it.
    const [crew] = await t.db.query(`SELECT id FROM users WHERE email = 'chief@alderforge.example'`);
    for (const r of rows) {
      await t.db.query(
        `INSERT INTO reading_amendments (reading_id, old_value, new_value, reason, by_user, at)
         SELECT id, value, value + 1.5, 'Gauge misread on the round', $2, taken_at + interval '10 minutes' FROM readings WHERE id = $1`,
        [r.id, crew.id],
      );
      await t.db.query(`UPDATE readings SET amended_value = value + 1.5 WHERE id = $1`, [r.id]);
    }
    const http = await binary(signedIn(t, observer).get(`/api/runs/${augustRunId}/log-sheet.pdf`));
    expect(http.status).toBe(200);
    expect(http.headers['content-disposition']).toBe('attachment; filename="run-log-2026-08-08-august-demonstration.pdf"');

    const r = await t.app.get(RunLogSheetService).render(augustRunId, PRINTED_BY, PRINTED_AT);
    const p = inspectPdf(r.buffer);
    expectClean(p, r.pages);
    expect(p.info.Title).toBe('Run log sheet: August demonstration');
    // started 10:30 UTC in August is 11:30 BST
    expect(p.text).toMatch(/Started\s+08 Aug 2026 11:30 BST/);
    expect(p.text).not.toContain(' UTC');
    expect(p.text).toContain('Printed 04 Dec 2026 09:15 GMT by Golden Printer');
    for (const heading of [
      'State history',
      'Readings',
      'Amendments',
      'Alarms',
      'Checklists',
      'Indicator card sets',
      'Close and countersignature',
    ])
      expect(p.text).toContain(heading);
    expect(p.text.match(/Gauge misread on the round/g)?.length).toBe(2);
    expect(p.text).toContain('Returned to normal');
    expect(p.text).not.toContain('No alarm was raised.');
    expect(p.text).not.toContain('No checklist was filled');
    expect(p.text).toMatch(/complete: every end of every cylinder has a card|incomplete: no card for/);
    expect(p.text).toContain('Signed on paper');
    expect(p.text).toMatch(/Countersigned\s+\S/);
    expect(compareWithGolden(r.buffer, 1, golden('run-log-sheet-p1'))).toBeLessThan(GOLDEN_TOLERANCE);
  });

  it('the blank checklist of each demo template prints cleanly, cautions inside their boxes', async () => {
    const templates: { id: string; name: string }[] = await t.db.query(`SELECT id, name FROM checklist_templates ORDER BY name`);
    expect(templates.length).toBeGreaterThan(0);
    for (const tpl of templates) {
      const r = await t.app.get(ChecklistPdfService).blank(tpl.id, undefined, PRINTED_BY, PRINTED_AT);
      const p = inspectPdf(r.buffer);
      const pages = Number(p.info.Pages);
      expectClean(p, pages);
      expect(r.filename).toMatch(/^checklist-[a-z0-9-]+-(v\d+|in-preparation)\.pdf$/);
    }
    const first = await t.app.get(ChecklistPdfService).blank(templates[0].id, undefined, PRINTED_BY, PRINTED_AT);
    expect(compareWithGolden(first.buffer, 1, golden('blank-checklist-p1'))).toBeLessThan(GOLDEN_TOLERANCE);
    const http = await binary(signedIn(t, observer).get(`/api/checklist-templates/${templates[0].id}/blank.pdf`));
    expect(http.status).toBe(200);
  });

  it('the bearing history report prints cleanly', async () => {
    const [bearing] = await t.db.query(`SELECT id FROM bearings ORDER BY label LIMIT 1`);
    const r = await t.app.get(BearingHistoryExportsService).pdf(bearing.id, PRINTED_BY, PRINTED_AT);
    const p = inspectPdf(r.buffer);
    expectClean(p, Number(p.info.Pages));
    expect(p.text).toContain('Inspections and work on the same timeline');
    expect(compareWithGolden(r.buffer, 1, golden('bearing-history-p1'))).toBeLessThan(GOLDEN_TOLERANCE);
    const http = await binary(signedIn(t, observer).get(`/api/maintenance/bearings/${bearing.id}/history.pdf`));
    expect(http.status).toBe(200);
  });

  it('each quote prints cleanly', async () => {
    const quotes: { id: string }[] = await t.db.query(`SELECT id FROM mill_quotes ORDER BY created_at`);
    expect(quotes.length).toBeGreaterThan(0);
    for (const q of quotes) {
      const r = await t.app.get(LotsService).quotePdf(q.id, PRINTED_BY, PRINTED_AT);
      const p = inspectPdf(r.buffer);
      expectClean(p, Number(p.info.Pages));
      expect(p.text).toContain('Total');
      expect(r.filename).toMatch(/^quote-bl26-\d{3}-q\d+\.pdf$/);
    }
    const r = await t.app.get(LotsService).quotePdf(quotes[0].id, PRINTED_BY, PRINTED_AT);
    expect(compareWithGolden(r.buffer, 1, golden('quote-p1'))).toBeLessThan(GOLDEN_TOLERANCE);
    const http = await binary(signedIn(t, observer).get(`/api/mill/quotes/${quotes[0].id}/quote.pdf`));
    expect(http.status).toBe(200);
  });

  it('a receipt prints cleanly: the lot, the sum in its currency, when it was paid, and no card data', async () => {
    const [row] = await t.db.query(`SELECT id FROM mill_lots ORDER BY reference LIMIT 1`);
    const lot = await t.app.get(LotsService).detail(row.id);
    const [lead] = await t.db.query(`SELECT id FROM users WHERE email = 'mill@alderforge.example'`);
    const payment: Payment = {
      id: '00000000-0000-4000-8000-000000000001',
      lotId: lot.id,
      kind: 'deposit',
      state: 'paid',
      amountMinor: 123456,
      refundedMinor: 0,
      currency: 'GBP',
      sessionId: 'cs_test_golden',
      checkoutUrl: 'http://127.0.0.1:4252/pay/cs_test_golden',
      paymentIntentId: 'pi_test_golden',
      emailedTo: lot.customerEmail,
      declineReason: null,
      askedBy: lead.id,
      askedAt: new Date('2026-12-01T10:00:00Z'),
      // 14:05 UTC in December is 14:05 GMT.
      paidAt: new Date('2026-12-03T14:05:00Z'),
    };
    const r = await t.app.get(ReceiptPdfService).render({ payment, lot, printedAt: PRINTED_AT });
    const p = inspectPdf(r.buffer);
    expectClean(p, Number(p.info.Pages));
    expect(r.filename).toMatch(/^receipt-bl26-\d{3}-deposit\.pdf$/);
    expect(p.info.Title).toBe(`Receipt: deposit for lot ${lot.reference}`);
    expect(p.text).toContain(`Receipt: deposit for lot ${lot.reference}`);
    expect(p.text).toContain('received 03 Dec 2026 14:05 GMT');
    expect(p.text).toMatch(/Deposit\s+£1,234\.56/);
    expect(p.text).toMatch(/Currency\s+GBP \(British Pound\)/);
    expect(p.text).toContain(lot.customerName);
    expect(p.text).toContain('pi_test_golden');
    expect(p.text).not.toMatch(/\b\d{4} ?\d{4} ?\d{4} ?\d{4}\b|card number|CVC|expiry/i);
    expect(compareWithGolden(r.buffer, 1, golden('receipt-p1'))).toBeLessThan(GOLDEN_TOLERANCE);
  });
});
