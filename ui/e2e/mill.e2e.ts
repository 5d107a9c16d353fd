import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import type { EngineDetail, MillDto, RunDetail, TokenPair } from '@crankjournal/shared-types';
import { DEMO_PASSWORD, signIn } from './helpers';

async function login(request: APIRequestContext, email: string): Promise<TokenPair> {
  const r = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(r.ok()).toBeTruthy();
  return (await r.json()) as TokenPair;
}
const auth = (t: string) => ({ authorization: `Bearer ${t}` });

/**
 * A run that is running, made through the API as the chief engineer: passes are logged only while a run
 * runs, and the demo's own open run ("Winter open day") is preparing and belongs to other tests. So this
 * test describes a fresh engine of its own (no checklist templates of its own, so the checklist rule of the
 * start gate has nothing to ask), a mill driven by it (the demo mill's stands, settings and rates), grants
 * the chief engineer the start-and-run qualification on it (the qualification rule of the start gate), and
 * takes the run through preparing and cleared to running by the normal transitions.
 */
async function runningRunWithMill(request: APIRequestContext): Promise<{ run: RunDetail; mill: MillDto }> {
  const chief = await login(request, 'chief@alderforge.example');
  const h = auth(chief.accessToken);
  const tag = Date.now().toString(36);
  const engineRes = await request.post('/api/engines', {
    headers: h,
    data: {
      name: `Mill test engine ${tag}`,
      builder: 'browser test',
      yearBuilt: '1911',
      type: 'simple',
      ratedSpeedRpm: 75,
      overspeedRpm: 82,
      mawpPsig: 150,
      preLubeFreshnessMinutes: 30,
      flywheelMassLb: 156800,
      flywheelRadiusOfGyrationFt: 9.9,
      cylinders: [{ label: 'C1', role: 'single', boreIn: 24, strokeIn: 48, pistonRodIn: 5, tailRodIn: 0, clearancePercent: 6 }],
      lubricationPoints: [],
      bearings: [],
      measurementPoints: [{ code: 'SPD', label: 'Speed', kind: 'speed', unit: 'rpm', sequence: 1 }],
    },
  });
  expect(engineRes.status(), await engineRes.text()).toBe(201);
  const engine = (await engineRes.json()) as EngineDetail;

  const today = new Date();
  const day = (d: Date) => d.toISOString().slice(0, 10);
  const qual = await request.post('/api/qualifications', {
    headers: h,
    data: {
      userId: chief.user.id,
      engineId: engine.id,
      duty: 'start_and_run',
      grantedOn: day(new Date(today.getTime() - 86_400_000)),
      expiresOn: day(new Date(today.getTime() + 300 * 86_400_000)),
    },
  });
  // Where the qualifications area is not installed the start gate has no such rule.
  expect([201, 404]).toContain(qual.status());

  const demo = ((await (await request.get('/api/mill/mills', { headers: h })).json()) as MillDto[]).find(
    (m) => m.name === 'Alder Forge bar mill',
  );
  expect(demo, 'the demo mill is seeded').toBeTruthy();
  const millRes = await request.post('/api/mill/mills', {
    headers: h,
    data: {
      name: `Mill test ${tag}`,
      engineId: engine.id,
      notes: 'Made by the browser test.',
      stands: demo!.stands.map(({ id: _id, ...s }) => s),
      settings: demo!.settings,
      quoteRates: demo!.quoteRates,
    },
  });
  expect(millRes.status(), await millRes.text()).toBe(201);
  const mill = (await millRes.json()) as MillDto;

  const runRes = await request.post('/api/runs', {
    headers: h,
    data: { engineId: engine.id, purpose: 'demonstration', title: `Rolling test ${tag}` },
  });
  expect(runRes.status()).toBe(201);
  let run = (await runRes.json()) as RunDetail;
  for (const to of ['preparing', 'cleared', 'running']) {
    const r = await request.post(`/api/runs/${run.id}/transitions`, { headers: h, data: { to } });
    expect(r.status(), `run to ${to}: ${await r.text()}`).toBe(200);
    run = (await r.json()) as RunDetail;
  }
  expect(run.state).toBe('running');
  return { run, mill };
}

async function choose(page: Page, label: string | RegExp, option: string | RegExp) {
  await page.getByRole('combobox', { name: label }).click();
  await page.getByRole('option', { name: option }).click();
}

test(
  'the mill lead plans a schedule from a template, logs passes during a run, ' + 'and sees the flywheel warning on an overloaded pass',
  async ({ page, request }) => {
    test.setTimeout(150_000);
    const { run, mill } = await runningRunWithMill(request);
    const scheduleName = `Open day rounds ${Date.now().toString(36)}`;

    await signIn(page, 'mill@alderforge.example');
    const nav = page.getByRole('navigation', { name: 'Main navigation' });
    await nav.getByRole('link', { name: 'Pass schedules' }).click();
    await expect(page.getByRole('heading', { name: 'Pass schedules' })).toBeVisible();
    await expect(page.getByRole('link', { name: '3 in square billet to 1½ in round' })).toBeVisible();

    // Plan from the template, on the mill the run drives.
    await page.getByRole('button', { name: 'Plan from a template' }).click();
    const dialog = page.getByRole('dialog');
    await choose(page, 'Template', /3 in square billet to 1½ in round/);
    await choose(page, 'Mill to roll it on', mill.name);
    await dialog.getByLabel('Name of the new schedule').fill(scheduleName);
    await dialog.getByRole('button', { name: 'Plan the schedule' }).click();
    await expect(page.getByRole('heading', { name: scheduleName })).toBeVisible();
    await expect(page.getByRole('link', { name: '3 in square billet to 1½ in round' })).toBeVisible();
    await expect(page.getByRole('table', { name: 'Passes of the schedule' }).locator('tbody tr[data-flagged]')).toHaveCount(8);
    await expect(page.getByTestId('flow-stress-extrapolated').first()).toBeVisible();

    // The run is in the rolling log; start a bar on the schedule and log its first pass as planned.
    await nav.getByRole('link', { name: 'Rolling log' }).click();
    await page.getByRole('link', { name: run.title }).click();
    await expect(page.getByRole('heading', { name: `Rolling log: ${run.title}` })).toBeVisible();
    await choose(page, 'Pass schedule', scheduleName);
    await page.getByRole('button', { name: 'Start bar' }).click();
    await expect(page.getByTestId('bar-B-01')).toBeVisible();
    await expect(page.getByLabel('Measured temperature, °C')).toHaveValue('1150');
    await page.getByLabel('Measured temperature, °C').fill('1138');
    await page.getByLabel('Measured exit: height, mm').fill('61.5');
    await page.getByRole('button', { name: 'Log pass' }).click();
    const result = page.getByTestId('last-pass-result');
    await expect(result).toContainText('Pass 1 of B-01 logged');
    await expect(result.getByRole('alert')).toHaveCount(0);

    // The next pass is offered from the schedule.
    await expect(page.getByLabel('Pass number')).toHaveValue('2');
    await page.getByRole('button', { name: 'Log pass' }).click();
    await expect(result).toContainText('Pass 2 of B-01 logged');

    // A wide flat bar rolled cold with a heavy draft and a long bar: the flywheel cannot carry it.
    await page.getByLabel('Bar id').fill('B-02');
    // This bar follows no schedule: clear the one kept from the last bar and give the stock.
    await choose(page, 'Pass schedule', 'None (give the stock)');
    await page.getByLabel('Stock: height, mm').fill('40');
    await page.getByLabel('Stock: width, mm').fill('150');
    await page.getByLabel('Stock length, mm').fill('6000');
    await page.getByRole('button', { name: 'Start bar' }).click();
    await expect(page.getByTestId('bar-B-02')).toBeVisible();
    await expect(page.getByLabel('Entry: height, mm')).toHaveValue('40');
    await page.getByLabel('Measured temperature, °C').fill('850');
    await page.getByLabel('Measured exit: height, mm').fill('25');
    await page.getByLabel('Measured exit: width, mm').fill('155');
    await page.getByRole('button', { name: 'Log pass' }).click();
    await expect(result).toContainText('Pass 1 of B-02 logged');
    const speedWarning = result.getByTestId('pass-warning-speed_drop');
    await expect(speedWarning).toContainText('Flywheel speed drop');
    await expect(speedWarning).toContainText('below 67.5 rpm (90 % of rated)');
    await expect(result.getByTestId('pass-warning-stand_force')).toContainText('Stand overloaded');

    // The flagged pass stays marked in the bar's passes and on the run's timeline.
    await expect(page.getByTestId('bar-B-02').locator('tr[data-flagged="true"]')).toHaveCount(1);
    await page.getByText('Timeline with readings and alarms').click();
    const timeline = page.getByRole('list', { name: 'Timeline of the run' });
    await expect(timeline.locator('[data-kind="pass"]')).toHaveCount(3);
    await expect(timeline.getByTestId('pass-warning-speed_drop')).toBeVisible();
  },
);
