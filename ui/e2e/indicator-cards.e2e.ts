import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { expect, test, type APIRequestContext, type Locator } from '@playwright/test';
import type { CardTrace, RunSummary, TokenPair, TracePoint } from '@crankjournal/shared-types';
import { DEMO_PASSWORD, signIn } from './helpers';

/** The demo's card images and the traces made on them (written by the service's draw-cards script). */
const CARDS_DIR = fileURLToPath(new URL('../../samples/cards/', import.meta.url));
const CARD = 'autumn-demonstration-075-hp-head';
interface SampleTrace {
  widthPx: number;
  heightPx: number;
  springPsiPerIn: number;
  lengthIn: number;
  trace: CardTrace;
}
const sample = (JSON.parse(readFileSync(`${CARDS_DIR}traces.json`, 'utf8')) as Record<string, SampleTrace>)[CARD];

async function token(request: APIRequestContext, email: string): Promise<string> {
  const r = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(r.ok()).toBeTruthy();
  return ((await r.json()) as TokenPair).accessToken;
}

/** The demo's open run of No. 2 engine (today's, being prepared or under way). */
async function openRun(request: APIRequestContext, accessToken: string): Promise<RunSummary> {
  const r = await request.get('/api/runs', { headers: { authorization: `Bearer ${accessToken}` } });
  const runs = (await r.json()) as RunSummary[];
  const open = runs.find((x) => x.engineName === 'No. 2 engine' && ['preparing', 'cleared', 'running', 'stopped'].includes(x.state));
  if (!open) throw new Error('the demo has no open run of No. 2 engine to take cards on');
  return open;
}

/** Outline points at least `minPx` apart, as a person clicks them. */
function spaced(points: TracePoint[], minPx: number): TracePoint[] {
  const out: TracePoint[] = [];
  for (const p of points) if (!out.length || Math.hypot(p.x - out[out.length - 1].x, p.y - out[out.length - 1].y) >= minPx) out.push(p);
  return out;
}

/** Clicks a point given in the image's own pixels on the tracer, whatever its zoom. */
async function clickImage(surface: Locator, p: TracePoint) {
  const box = (await surface.boundingBox())!;
  const scale = box.width / sample.widthPx;
  await surface.click({ position: { x: p.x * scale, y: p.y * scale } });
}

test(
  'an operator uploads a card photo, calibrates and traces it, sees MEP and horsepower; ' +
    'a second viewer sees the set’s total arrive live',
  async ({ page, browser, request }) => {
    test.setTimeout(120_000);
    const operatorToken = await token(request, 'operator@alderforge.example');
    const run = await openRun(request, operatorToken);

    // A second viewer (an observer, read-only) watches the run's cards in another browser context.
    const watcherContext = await browser.newContext();
    const watcher = await watcherContext.newPage();
    await signIn(watcher, 'observer@alderforge.example');
    await watcher.goto(`/runs/${run.id}/cards`);
    await expect(watcher.getByTestId('card-sets-panel')).toBeVisible();
    await expect(watcher.getByRole('button', { name: 'Take a card set' })).toHaveCount(0);
    const setsBefore = await watcher.getByTestId('card-set').count();

    await signIn(page, 'operator@alderforge.example');
    await page.goto(`/runs/${run.id}/cards`);
    await page.getByRole('button', { name: 'Take a card set' }).click();
    await page.getByLabel('Speed, rpm').fill('75');

    const editor = page.getByTestId('card-editor-HP-head');
    await editor.getByText('Image', { exact: true }).click();
    await editor.getByLabel('Spring, psi per inch').fill(String(sample.springPsiPerIn));
    await editor.getByLabel('Card length, in').fill(String(sample.lengthIn));
    await editor.locator('input[type=file]').setInputFiles(`${CARDS_DIR}${CARD}.png`);

    const surface = editor.getByTestId('card-tracer-surface');
    await expect(surface).toBeVisible();
    // The photo's proposed trace is set aside: this operator traces by hand.
    await expect(editor.getByTestId('autotrace-proposal')).toBeVisible();
    await editor.getByRole('button', { name: 'Trace by hand' }).click();
    await expect(editor.getByTestId('tracer-step')).toHaveText('Atmospheric line 0/2');

    // Calibrate: two points on the atmospheric line, then the admission and release ends of the diagram.
    const t = sample.trace;
    await clickImage(surface, t.atmosphericLine[0]);
    await clickImage(surface, t.atmosphericLine[1]);
    await expect(editor.getByTestId('tracer-atm-mark')).toHaveCount(2);
    await clickImage(surface, t.admissionEndPx);
    await clickImage(surface, t.releaseEndPx);
    await expect(editor.getByTestId('tracer-step')).toHaveText('Outline: 0 points');

    // Trace the outline; one stray click is taken back with Undo.
    const outline = spaced(t.pointsPx, 30);
    for (const p of outline) await clickImage(surface, p);
    await clickImage(surface, { x: sample.widthPx * 0.05, y: sample.heightPx * 0.05 });
    await expect(editor.getByTestId('tracer-point')).toHaveCount(outline.length + 1);
    await editor.getByRole('button', { name: 'Undo' }).click();
    await expect(editor.getByTestId('tracer-point')).toHaveCount(outline.length);

    // The mean pressure shown is the server's calibration of these very clicks.
    const expected = await request.post('/api/calculations/indicator-trace', {
      headers: { authorization: `Bearer ${operatorToken}` },
      data: { trace: { ...t, pointsPx: outline }, springPsiPerIn: sample.springPsiPerIn, lengthIn: sample.lengthIn },
    });
    const expectedMep = ((await expected.json()) as { meanEffectivePressurePsi: number }).meanEffectivePressurePsi;
    const mepText = editor.getByTestId('card-mep');
    await expect(mepText).toHaveText(/MEP \d+(\.\d)? psi/);
    const shownMep = Number((await mepText.textContent())!.replace(/[^\d.]/g, ''));
    expect(Math.abs(shownMep - expectedMep) / expectedMep).toBeLessThan(0.01);
    await expect(editor.getByTestId('card-ihp')).toHaveText(/\d+ ihp/);
    const totalText = page.getByTestId('preview-total-ihp');
    await expect(totalText).toHaveText(/[1-9][\d,]* ihp/);

    await page.getByRole('button', { name: 'Save card set' }).click();
    const saved = page.getByTestId('card-set').first();
    await expect(saved).toBeVisible();
    const total = (await saved.getByTestId('card-set-total').textContent())!;
    expect(total).toMatch(/[1-9][\d,]* ihp/);

    // The watcher's page gains the set without reloading, with the same total.
    await expect(watcher.getByTestId('card-set')).toHaveCount(setsBefore + 1);
    await expect(watcher.getByTestId('card-set').first().getByTestId('card-set-total')).toHaveText(total);
    await watcherContext.close();
  },
);

test('an operator uploads a card photo, accepts the proposed trace and sees the horsepower, in seconds', async ({ page, request }) => {
  const operatorToken = await token(request, 'operator@alderforge.example');
  const run = await openRun(request, operatorToken);
  await signIn(page, 'operator@alderforge.example');
  await page.goto(`/runs/${run.id}/cards`);
  await page.getByRole('button', { name: 'Take a card set' }).click();
  await page.getByLabel('Speed, rpm').fill('75');
  const editor = page.getByTestId('card-editor-HP-head');
  await editor.getByText('Image', { exact: true }).click();
  await editor.getByLabel('Spring, psi per inch').fill(String(sample.springPsiPerIn));
  await editor.getByLabel('Card length, in').fill(String(sample.lengthIn));

  // The test's own clock: from choosing the photo to the horsepower on the screen.
  const started = Date.now();
  await editor.locator('input[type=file]').setInputFiles(`${CARDS_DIR}${CARD}.png`);
  const proposal = editor.getByTestId('autotrace-proposal');
  await expect(proposal).toBeVisible();
  await expect(editor.getByTestId('tracer-atm-mark')).toHaveCount(2);
  expect(await editor.getByTestId('tracer-point').count()).toBeGreaterThan(20);
  await expect(editor.getByTestId('autotrace-confidence')).toHaveText(/confidence \d+ %/);
  await editor.getByRole('button', { name: 'Accept the proposed trace' }).click();
  await expect(editor.getByTestId('card-ihp')).toHaveText(/[1-9]\d* ihp/);
  const seconds = (Date.now() - started) / 1000;
  test.info().annotations.push({ type: 'photo to horsepower, s', description: seconds.toFixed(1) });
  console.log(`photo to horsepower: ${seconds.toFixed(1)} s`);
  expect(seconds).toBeLessThan(10);

  // The proposal's MEP agrees with the careful hand trace made on the same card (traces.json) within 2 %.
  const handTrace = await request.post('/api/calculations/indicator-trace', {
    headers: { authorization: `Bearer ${operatorToken}` },
    data: { trace: sample.trace, springPsiPerIn: sample.springPsiPerIn, lengthIn: sample.lengthIn },
  });
  const handMep = ((await handTrace.json()) as { meanEffectivePressurePsi: number }).meanEffectivePressurePsi;
  const shownMep = Number((await editor.getByTestId('card-mep').textContent())!.replace(/[^\d.]/g, ''));
  expect(Math.abs(shownMep - handMep) / handMep).toBeLessThan(0.02);
  await expect(page.getByTestId('preview-total-ihp')).toHaveText(/[1-9][\d,]* ihp/);

  // Saved, the card says how its trace was made.
  await page.getByRole('button', { name: 'Save card set' }).click();
  const saved = page.getByTestId('card-set').first();
  await expect(saved.getByTestId('card-set-total')).toHaveText(/[1-9][\d,]* ihp/);
  await expect(saved.getByTestId('card-trace-origin')).toHaveText('traced automatically, accepted');
});

test('the indicated power calculator works out the example and names a bad field', async ({ page }) => {
  await signIn(page, 'observer@alderforge.example');
  await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Indicated power' }).click();
  await expect(page.getByRole('heading', { name: 'Indicated power' })).toBeVisible();
  await expect(page.getByTestId('calc-total')).toHaveText(/\d+\.\d ihp/);
  // The HP head-end card is Machinery’s Reference Series No. 70 example: 2.6 in², 3.6 in, 60-lb spring → 43.3 psi.
  await expect(page.getByRole('table', { name: 'Indicated power by end' }).getByRole('row', { name: /HP head end/ })).toContainText(
    '43.33',
  );
  await page.getByTestId('calc-cylinder-0').getByLabel('Piston rod, in').fill('30');
  await expect(page.getByTestId('calc-error')).toContainText('cylinders[0].pistonRodIn');
});
