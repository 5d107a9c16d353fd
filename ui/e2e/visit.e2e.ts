import { randomUUID } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import type { EngineDetail, RunDetail, TokenPair, VisitorBoardDto } from '@crankjournal/shared-types';
import { DEMO_PASSWORD, signIn } from './helpers';

/**
 * The visitor board: a phone-sized public page that follows readings as they are submitted, the big-screen mode at
 * 1920×1080 with no scrolling, axe-core clean; the chief engineer's screen and the printed QR page of the demo's
 * open-day board. The live part uses an engine and a running run of its own (the demo's open run belongs to other
 * tests), taken through preparing and cleared to running by the normal transitions.
 */
const SHOTS = process.env.SCREENSHOT_DIR ?? '../.data/test-results/screens';

async function login(request: APIRequestContext, email: string): Promise<TokenPair & { user: { id: string } }> {
  const r = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(r.ok()).toBeTruthy();
  return (await r.json()) as TokenPair & { user: { id: string } };
}
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

async function axeClean(page: Page, what: string) {
  const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21aa']).analyze();
  const bad = result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.id}: ${v.help} (${v.nodes
          .map((n) => n.target.join(' '))
          .slice(0, 3)
          .join(', ')})`,
    );
  expect(bad, what).toEqual([]);
}

async function runningBoard(request: APIRequestContext) {
  const chief = await login(request, 'chief@alderforge.example');
  const h = auth(chief.accessToken);
  const tag = Date.now().toString(36);
  const engineRes = await request.post('/api/engines', {
    headers: h,
    data: {
      name: `Visitor test engine ${tag}`,
      builder: 'browser test',
      yearBuilt: '1905',
      type: 'simple',
      ratedSpeedRpm: 75,
      overspeedRpm: 82,
      mawpPsig: 150,
      preLubeFreshnessMinutes: 30,
      cylinders: [{ label: 'C1', role: 'single', boreIn: 24, strokeIn: 48, pistonRodIn: 5, tailRodIn: 0, clearancePercent: 6 }],
      lubricationPoints: [],
      bearings: [],
      measurementPoints: [
        { code: 'SPD', label: 'Speed', kind: 'speed', unit: 'rpm', sequence: 1 },
        { code: 'THR', label: 'Throttle', kind: 'throttle_pressure', unit: 'psig', sequence: 2 },
      ],
    },
  });
  expect(engineRes.status(), await engineRes.text()).toBe(201);
  const engine = (await engineRes.json()) as EngineDetail;
  const day = (d: Date) => d.toISOString().slice(0, 10);
  const qual = await request.post('/api/qualifications', {
    headers: h,
    data: {
      userId: chief.user.id,
      engineId: engine.id,
      duty: 'start_and_run',
      grantedOn: day(new Date(Date.now() - 86_400_000)),
      expiresOn: day(new Date(Date.now() + 300 * 86_400_000)),
    },
  });
  expect([201, 404]).toContain(qual.status());
  const runRes = await request.post('/api/runs', {
    headers: h,
    data: { engineId: engine.id, purpose: 'demonstration', title: `Visitors' afternoon ${tag}` },
  });
  expect(runRes.status()).toBe(201);
  let run = (await runRes.json()) as RunDetail;
  for (const to of ['preparing', 'cleared', 'running']) {
    const r = await request.post(`/api/runs/${run.id}/transitions`, { headers: h, data: { to } });
    expect(r.status(), `run to ${to}: ${await r.text()}`).toBe(200);
    run = (await r.json()) as RunDetail;
  }
  const boardRes = await request.post('/api/visitor-boards', { headers: h, data: { runId: run.id } });
  expect(boardRes.status(), await boardRes.text()).toBe(201);
  const board = (await boardRes.json()) as VisitorBoardDto;
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;
  /** A round of speed and pressure readings, as the crew submit them. */
  const submit = async (rpm: number, psig: number) => {
    const takenAt = new Date().toISOString();
    const r = await request.post(`/api/runs/${run.id}/rounds`, {
      headers: h,
      data: {
        takenAt,
        readings: [
          { clientId: randomUUID(), pointId: point('SPD'), value: rpm, takenAt },
          { clientId: randomUUID(), pointId: point('THR'), value: psig, takenAt },
        ],
      },
    });
    expect(r.status(), await r.text()).toBe(201);
  };
  return { board, run, submit };
}

test('a phone-sized visitor board follows the readings live; the big screen fits 1920×1080; both axe clean', async ({
  browser,
  request,
}) => {
  test.setTimeout(120_000);
  const { board, run, submit } = await runningBoard(request);
  const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, locale: 'en-US', isMobile: true, hasTouch: true });
  const page = await phone.newPage();
  await page.goto(board.path);
  await expect(page.getByRole('heading', { name: run.title })).toBeVisible();
  await expect(page.getByTestId('engine-state')).toHaveText(/The engine is working/);

  await submit(71, 128);
  // A few seconds late (VISIT_DELAY_SECONDS), then every couple of seconds: no reload.
  await expect(page.getByTestId('figure-Speed')).toContainText('71', { timeout: 20_000 });
  await expect(page.getByTestId('figure-Steam pressure')).toContainText('128');
  await expect(page.getByTestId('figure-Steam pressure')).toContainText('lb per square inch');
  await expect(page.getByRole('img', { name: 'The flywheel turning at 71 turns a minute' })).toBeVisible();
  await submit(74, 132);
  // Smoothed: the mean of the readings within 15 s, so 72.5 → shown as 73 (or 74 once the first falls out).
  await expect(page.getByTestId('figure-Speed')).toContainText(/7[34]/, { timeout: 20_000 });
  // The flywheel turns: its drawing's rotation changes between two looks.
  const wheel = page.getByTestId('flywheel-wheel');
  const a = await wheel.getAttribute('transform');
  await page.waitForTimeout(300);
  expect(await wheel.getAttribute('transform')).not.toBe(a);
  await page.locator('label', { hasText: 'Metric' }).click();
  await expect(page.getByTestId('figure-Steam pressure')).toContainText('bar');
  await page.screenshot({ path: `${SHOTS}/visit-phone.png` });
  await axeClean(page, 'the visitor board on a phone');
  await phone.close();

  const wall = await browser.newContext({ viewport: { width: 1920, height: 1080 } });
  const big = await wall.newPage();
  await big.goto(`${board.path}?wall`);
  await expect(big.getByTestId('visit-wall')).toBeVisible();
  await expect(big.locator('html')).toHaveAttribute('data-mantine-color-scheme', 'dark');
  await expect(big.getByTestId('figure-Speed')).toContainText(/7[34]/, { timeout: 20_000 });
  const fits = await big.evaluate(() => document.documentElement.scrollHeight <= window.innerHeight + 1);
  expect(fits, 'the wall mode does not scroll').toBe(true);
  const fontPx = await big
    .getByTestId('figure-Speed')
    .getByTestId('figure-value')
    .evaluate((el) => parseFloat(getComputedStyle(el).fontSize));
  expect(fontPx).toBeGreaterThanOrEqual(64);
  await big.screenshot({ path: `${SHOTS}/visit-wall-1920x1080.png` });
  await axeClean(big, 'the visitor board on the wall');
  await wall.close();
});

test("the chief engineer switches the demo's open-day board and prints its QR page", async ({ page }) => {
  await signIn(page, 'chief@alderforge.example');
  const nav = page.getByRole('navigation', { name: 'Main navigation' });
  await nav.getByRole('link', { name: 'Visitor boards' }).click();
  await expect(page.getByRole('heading', { name: 'Visitor boards' })).toBeVisible();
  const card = page.getByTestId(/^board-/).filter({ has: page.getByRole('heading', { name: 'Winter open day' }) });
  await expect(card.getByRole('switch')).toBeChecked();
  const address = (await card.getByRole('link', { name: /\/visit\// }).textContent())!;
  await card.getByRole('link', { name: 'QR code to print' }).click();
  await expect(page.getByRole('heading', { name: 'See the engine at work' })).toBeVisible();
  await expect(page.getByRole('img', { name: `QR code for ${address}` })).toBeVisible();
  await expect(page.getByText(address, { exact: true })).toBeVisible();
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
  await page.screenshot({ path: `${SHOTS}/visit-qr-print.png` });
  await page.emulateMedia({ media: 'screen' });
  await axeClean(page, 'the QR page');

  // The demo's board is on from the start: a visitor opens it without signing in.
  const visitor = await page
    .context()
    .browser()!
    .newContext({ viewport: { width: 390, height: 844 } });
  const v = await visitor.newPage();
  await v.goto(new URL(address).pathname);
  await expect(v.getByRole('heading', { name: 'Winter open day' })).toBeVisible();
  await expect(v.getByRole('region', { name: "The engine's story" })).toContainText('No. 2 engine was built');
  await axeClean(v, "the demo's visitor board");
  await visitor.close();
});
