import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import type {
  ChecklistDetail,
  ChecklistTemplateDetail,
  ChecklistTemplateSummary,
  EngineDetail,
  RunDetail,
  RunSummary,
  StartGateVerdict,
} from '@crankjournal/shared-types';
import { DEMO_PASSWORD, signIn } from './helpers';

/** The tablet on its stand in the engine house. */
test.use({ viewport: { width: 1024, height: 768 } });

async function token(request: APIRequestContext, email: string): Promise<string> {
  const r = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(r.ok()).toBeTruthy();
  return (await r.json()).accessToken;
}
const auth = (t: string) => ({ authorization: `Bearer ${t}` });

/** Records an item on the open checklist page and waits until the server has it done. */
async function doItem(page: Page, key: string, how: { tick?: true; value?: number; choice?: string }) {
  const card = page.getByTestId(`item-${key}`);
  await card.scrollIntoViewIfNeeded();
  if (how.tick) await card.getByRole('button', { name: 'Mark done' }).click();
  if (how.value !== undefined) {
    await card.getByTestId(`reading-${key}`).fill(String(how.value));
    await card.getByTestId(`reading-${key}`).press('Tab');
  }
  if (how.choice) await card.getByRole('radio', { name: how.choice }).click();
  await expect(card).toHaveAttribute('data-done', 'true');
}

async function signOpenChecklist(page: Page) {
  const bar = page.getByRole('navigation', { name: 'Checklist actions' });
  await expect(bar).toContainText('ready to sign');
  await bar.getByRole('button', { name: 'Sign checklist' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('Your password or signing PIN').fill(DEMO_PASSWORD);
  await dialog.getByRole('button', { name: 'Sign checklist' }).click();
  await expect(page.getByTestId('signature')).toContainText('Signed by Tobias Wrenfield');
}

test(
  'an operator completes the pre-lube and pre-start checklists on the tablet; ' + 'the run is cleared, the countdown shows, the run starts',
  async ({ page, request }) => {
    test.setTimeout(120_000);
    const op = await token(request, 'operator@alderforge.example');
    const runs = (await (await request.get('/api/runs', { headers: auth(op) })).json()) as RunSummary[];
    const run = runs.find((r) => r.title === 'Winter open day');
    expect(run?.state).toBe('preparing');

    await signIn(page, 'operator@alderforge.example');
    await page.goto(`/runs/${run!.id}/checklists`);
    await expect(page.getByRole('heading', { name: 'Checklists — Winter open day' })).toBeVisible();
    await expect(page.getByTestId('gate-reasons')).toContainText('Pre-lube: no checklist has been started');

    // Pre-lube, in any order; a low line pressure first shows up as outside its range and blocks signing.
    await page.getByTestId('template-Pre-lube').getByRole('button', { name: 'Start checklist' }).click();
    await expect(page.getByRole('heading', { name: 'Pre-lube', exact: true })).toBeVisible();
    await expect(page.getByTestId('item-line-pressure')).toContainText('Acceptance range: 15 to 30 psig');
    await expect(page.getByTestId('item-line-pressure')).toContainText('Caution — Pressure');
    await doItem(page, 'line-pressure', { value: 12 });
    await expect(page.getByTestId('item-line-pressure')).toContainText('signing is blocked');
    await doItem(page, 'pump-stopped', { tick: true });
    await doItem(page, 'tank-filled', { tick: true });
    await doItem(page, 'tank-temp', { value: 68 });
    await doItem(page, 'strainer', { tick: true });
    await doItem(page, 'valves-open', { tick: true });
    await doItem(page, 'pump-minutes', { value: 10 });
    await doItem(page, 'oil-at-ends', { choice: 'Both bearings' });
    await doItem(page, 'sight-feeds', { tick: true });
    await doItem(page, 'crankpin-drops', { value: 8 });
    await doItem(page, 'grease-cups', { tick: true });
    await doItem(page, 'cyl-lubricator', { tick: true });
    await expect(page.getByRole('navigation', { name: 'Checklist actions' })).toContainText('outside the acceptance range');
    await expect(
      page.getByRole('navigation', { name: 'Checklist actions' }).getByRole('button', { name: 'Sign checklist' }),
    ).toBeDisabled();
    await doItem(page, 'line-pressure', { value: 22 });
    await expect(page.getByTestId('item-line-pressure')).not.toContainText('signing is blocked');
    await signOpenChecklist(page);

    // Pre-start inspection.
    await page.getByRole('link', { name: 'All checklists of this run' }).click();
    await expect(page.getByTestId('template-Pre-lube')).toContainText('Signed by Tobias Wrenfield');
    await page.getByTestId('template-Pre-start inspection').getByRole('button', { name: 'Start checklist' }).click();
    await expect(page.getByRole('heading', { name: 'Pre-start inspection' })).toBeVisible();
    await doItem(page, 'guards', { tick: true });
    await doItem(page, 'barring', { choice: 'Disengaged and locked out of mesh' });
    await doItem(page, 'bed-clear', { tick: true });
    await doItem(page, 'crew-told', { tick: true });
    await doItem(page, 'drain-cocks', { choice: 'All open' });
    await doItem(page, 'line-drains', { tick: true });
    await doItem(page, 'boiler-pressure', { value: 135 });
    await doItem(page, 'throttle', { tick: true });
    await doItem(page, 'governor', { tick: true });
    await doItem(page, 'condenser', { tick: true });
    await doItem(page, 'mill-clutch', { tick: true });
    await signOpenChecklist(page);

    // Signing the last pre-start checklist clears the run; the pre-lube window counts down.
    await page.getByRole('link', { name: 'All checklists of this run' }).click();
    await expect(page.getByText('Cleared to start', { exact: true })).toBeVisible();
    const countdown = page.getByTestId('pre-lube-countdown');
    await expect(countdown).toBeVisible();
    await expect(countdown).toContainText('Pre-lube fresh for');
    const first = await page.getByTestId('pre-lube-remaining').textContent();
    expect(first).toMatch(/^(29|30|2\d):\d\d$/);
    await expect(page.getByTestId('pre-lube-remaining')).not.toHaveText(first!, { timeout: 5_000 });
    await expect(page.getByTestId('gate-clear')).toBeVisible();

    await page.getByTestId('gate-panel').getByRole('button', { name: 'Start engine' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Start engine' }).click();
    await expect(page).toHaveURL(new RegExp(`/runs/${run!.id}$`));
    await expect(page.getByTestId('run-header')).toContainText('Running');
  },
);

test('a second attempt with a stale pre-lube is refused, with the reason shown', async ({ page, request }) => {
  // The window is set to 1 minute on an engine of the test's own (the demo engine keeps its 30 minutes).
  test.setTimeout(150_000);
  const chief = await token(request, 'chief@alderforge.example');
  const op = await token(request, 'operator@alderforge.example');
  const engines = (await (await request.get('/api/engines', { headers: auth(chief) })).json()) as { id: string; name: string }[];
  const demo = engines.find((e) => e.name === 'No. 2 engine')!;
  const d = (await (await request.get(`/api/engines/${demo.id}`, { headers: auth(chief) })).json()) as EngineDetail;
  const created = await request.post('/api/engines', {
    headers: auth(chief),
    data: {
      name: `Stale pre-lube test ${Date.now()}`,
      builder: d.builder,
      yearBuilt: d.yearBuilt,
      type: d.type,
      ratedSpeedRpm: d.ratedSpeedRpm,
      overspeedRpm: d.overspeedRpm,
      mawpPsig: d.mawpPsig,
      preLubeFreshnessMinutes: 1,
      cylinders: d.cylinders.map(({ label, role, boreIn, strokeIn, pistonRodIn, tailRodIn, clearancePercent }) => ({
        label,
        role,
        boreIn,
        strokeIn,
        pistonRodIn,
        tailRodIn,
        clearancePercent,
      })),
      lubricationPoints: [],
      bearings: [],
      measurementPoints: [],
    },
  });
  expect(created.status()).toBe(201);
  const engine = (await created.json()) as EngineDetail;

  // The demo engine's two pre-start templates, copied; the operator qualified on this engine too.
  const templates = (await (
    await request.get(`/api/checklist-templates?engineId=${demo.id}`, { headers: auth(chief) })
  ).json()) as ChecklistTemplateSummary[];
  for (const t of templates.filter((x) => x.requiredWhen === 'before_start' && !x.withdrawn)) {
    const full = (await (
      await request.get(`/api/checklist-templates/${t.id}`, { headers: auth(chief) })
    ).json()) as ChecklistTemplateDetail;
    expect(
      (
        await request.post('/api/checklist-templates', {
          headers: auth(chief),
          data: { ...full.current!.content, engineId: engine.id, issue: true },
        })
      ).status(),
    ).toBe(201);
  }
  const me = (await (await request.get('/api/auth/me', { headers: auth(op) })).json()) as { id: string };
  const today = new Date().toISOString().slice(0, 10);
  const nextYear = new Date(Date.now() + 365 * 86_400_000).toISOString().slice(0, 10);
  for (const duty of ['pre_lube', 'start_and_run']) {
    const g = await request.post('/api/qualifications', {
      headers: auth(chief),
      data: { userId: me.id, engineId: engine.id, duty, grantedOn: today, expiresOn: nextYear },
    });
    expect(g.status()).toBe(201);
  }

  // A run whose pre-start checklists are done and signed: it is cleared.
  const run = (await (
    await request.post('/api/runs', { headers: auth(op), data: { engineId: engine.id, purpose: 'test', title: 'Second start attempt' } })
  ).json()) as RunDetail;
  expect((await request.post(`/api/runs/${run.id}/transitions`, { headers: auth(op), data: { to: 'preparing' } })).status()).toBe(200);
  const overview = await (await request.get(`/api/runs/${run.id}/checklists`, { headers: auth(op) })).json();
  for (const s of overview.templates as { template: ChecklistTemplateSummary }[]) {
    const c = (await (
      await request.post(`/api/runs/${run.id}/checklists`, { headers: auth(op), data: { templateId: s.template.id } })
    ).json()) as ChecklistDetail;
    for (const it of c.sections.flatMap((x) => x.items).filter((x) => x.required)) {
      const value =
        it.kind === 'tick'
          ? { tick: true }
          : it.kind === 'reading'
            ? { value: it.min ?? it.max ?? 1 }
            : it.kind === 'choice'
              ? { choice: it.acceptable?.[0] ?? it.choices![0] }
              : { text: 'Checked.' };
      expect((await request.put(`/api/checklists/${c.id}/items/${it.key}`, { headers: auth(op), data: value })).status()).toBe(200);
    }
    expect((await request.post(`/api/checklists/${c.id}/sign`, { headers: auth(op), data: { signature: DEMO_PASSWORD } })).status()).toBe(
      200,
    );
  }
  const cleared = (await (await request.get(`/api/runs/${run.id}`, { headers: auth(op) })).json()) as RunDetail;
  expect(cleared.state).toBe('cleared');

  // The operator watches the window run out on the tablet.
  await signIn(page, 'operator@alderforge.example');
  await page.goto(`/runs/${run.id}/checklists`);
  await expect(page.getByTestId('pre-lube-countdown')).toContainText('Pre-lube fresh for');
  await expect(page.getByTestId('pre-lube-countdown')).toContainText('Pre-lube window has passed', { timeout: 75_000 });
  await expect(page.getByTestId('pre-lube-remaining')).toHaveText('0:00');
  await expect
    .poll(
      async () =>
        ((await (await request.get(`/api/runs/${run.id}/start-gate`, { headers: auth(op) })).json()) as StartGateVerdict).reasons.map(
          (r) => r.code,
        ),
      { timeout: 10_000 },
    )
    .toContain('pre_lube_stale');

  // The attempt to start is refused by the server; the screen shows why.
  await page.getByTestId('gate-panel').getByRole('button', { name: 'Start engine' }).click();
  await page.getByRole('dialog').getByRole('button', { name: 'Start engine' }).click();
  const refused = page.getByTestId('start-refused');
  await expect(refused).toBeVisible();
  await expect(refused).toContainText('Start refused');
  await expect(refused).toContainText(/The pre-lube sign-off \(Pre-lube\) is \d+ (s|min) old/);
  await expect(refused).toContainText('Pre-lube again');
  await expect(page.getByText('Cleared to start', { exact: true })).toBeVisible();
  const after = (await (await request.get(`/api/runs/${run.id}`, { headers: auth(op) })).json()) as RunDetail;
  expect(after.state).toBe('cleared');

  // Leave the test engine free.
  await request.post(`/api/runs/${run.id}/transitions`, {
    headers: auth(chief),
    data: { to: 'abandoned', note: 'Browser test of a stale pre-lube.' },
  });
});
