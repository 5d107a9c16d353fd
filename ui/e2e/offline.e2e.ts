import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import type { ChecklistDetail, ChecklistTemplateDetail, EngineDetail, ReadingDto, RunDetail } from '@crankjournal/shared-types';
import { DEMO_PASSWORD, signIn } from './helpers';

/**
 * The tablet loses the engine house's Wi-Fi: the app still loads (service worker), what the operator records waits in
 * IndexedDB, and when the network returns it arrives once, in the order it was made; what the server refuses is shown
 * with its reason. Runs on engines of its own, so it depends on no other test's runs.
 */
test.use({ viewport: { width: 1024, height: 768 }, serviceWorkers: 'allow' });

const here = dirname(fileURLToPath(import.meta.url));
/** A real PNG (our own app icon): the server checks an upload's bytes. */
const PHOTO = readFileSync(join(here, '..', 'public', 'icons', 'icon-192.png'));

async function token(request: APIRequestContext, email: string): Promise<string> {
  const r = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(r.ok()).toBeTruthy();
  return ((await r.json()) as { accessToken: string }).accessToken;
}
const auth = (t: string) => ({ authorization: `Bearer ${t}` });
/** A field by the start of its label (the unit follows). */
const label = (s: string) => new RegExp(`^${s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`);

async function ok<T>(r: Promise<import('@playwright/test').APIResponse>): Promise<T> {
  const res = await r;
  expect(res.ok(), `${res.url()} answered ${res.status()}: ${await res.text()}`).toBeTruthy();
  return (await res.json()) as T;
}

/** A copy of the demo engine under a new name, an issued checklist for it (a tick and a photo), and a preparing run. */
async function engineWithRun(request: APIRequestContext, chief: string, op: string, name: string) {
  const engines = await ok<EngineDetail[]>(request.get('/api/engines', { headers: auth(chief) }));
  // The demo's engine by its name: other browser tests add engines of their own, which may sort first.
  const demoId = (engines.find((e) => e.name === 'No. 2 engine') ?? engines[0]).id;
  const demo = await ok<EngineDetail>(request.get(`/api/engines/${demoId}`, { headers: auth(chief) }));
  const strip = <T extends { id?: string }>(xs: T[]) => xs.map(({ id: _id, ...rest }) => rest);
  const engine = await ok<EngineDetail>(
    request.post('/api/engines', {
      headers: auth(chief),
      data: {
        name,
        builder: demo.builder,
        yearBuilt: demo.yearBuilt,
        type: demo.type,
        ratedSpeedRpm: demo.ratedSpeedRpm,
        overspeedRpm: demo.overspeedRpm,
        mawpPsig: demo.mawpPsig,
        preLubeFreshnessMinutes: demo.preLubeFreshnessMinutes,
        cylinders: strip(demo.cylinders),
        lubricationPoints: strip(demo.lubricationPoints),
        bearings: strip(demo.bearings),
        measurementPoints: strip(demo.measurementPoints),
      },
    }),
  );
  const template = await ok<ChecklistTemplateDetail>(
    request.post('/api/checklist-templates', {
      headers: auth(chief),
      data: {
        engineId: engine.id,
        issue: true,
        name: 'Tablet round check',
        purpose: 'warm_up',
        requiredWhen: 'not_required',
        requiredDuty: 'start_and_run',
        description: 'Kept for the record.',
        sections: [
          {
            key: 'board',
            title: 'Gauge board',
            items: [
              { key: 'gauges-read', kind: 'tick', label: 'Every gauge on the board read', required: true },
              { key: 'board-photo', kind: 'photo', label: 'Photo of the gauge board', required: false },
            ],
          },
        ],
      },
    }),
  );
  const run = await ok<RunDetail>(
    request.post('/api/runs', { headers: auth(op), data: { engineId: engine.id, purpose: 'test', title: `${name} run` } }),
  );
  await ok<RunDetail>(request.post(`/api/runs/${run.id}/transitions`, { headers: auth(op), data: { to: 'preparing' } }));
  const checklist = await ok<ChecklistDetail>(
    request.post(`/api/runs/${run.id}/checklists`, { headers: auth(op), data: { templateId: template.id } }),
  );
  return { engine, run, checklist };
}

/** The page is controlled by the service worker (it takes over at its first install). */
async function controlled(page: Page) {
  await page.waitForFunction(() => !!navigator.serviceWorker?.controller, null, { timeout: 20_000 });
}

test('offline: the round page loads, a round and a checklist item with a photo wait on the tablet and arrive once, in order', async ({
  page,
  context,
  request,
}) => {
  test.setTimeout(150_000);
  const stamp = Date.now().toString(36);
  const chief = await token(request, 'chief@alderforge.example');
  const op = await token(request, 'operator@alderforge.example');
  const a = await engineWithRun(request, chief, op, `Offline engine A ${stamp}`);
  const b = await engineWithRun(request, chief, op, `Offline engine B ${stamp}`);
  const [p1, p2] = [...a.engine.measurementPoints].sort((x, y) => x.sequence - y.sequence);

  // Online: sign in, let the service worker take over, open the pages the crew will need (they are cached as read).
  await signIn(page, 'operator@alderforge.example');
  await controlled(page);
  await expect(page.locator('link[rel="manifest"]')).toHaveAttribute('href', '/manifest.webmanifest');
  for (const path of [
    `/runs/${a.run.id}/round`,
    `/runs/${a.run.id}/checklists/${a.checklist.id}`,
    `/runs/${b.run.id}/checklists/${b.checklist.id}`,
  ]) {
    await page.goto(path);
    await expect(page.getByTestId('signed-in-name')).toBeVisible();
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  }
  await page.goto(`/runs/${a.run.id}/round`);
  await expect(page.getByLabel(label(p1.label))).toBeVisible();

  // The writes that reached the server, in order (an attempt without the network fails and is not listed).
  const writes: string[] = [];
  page.on('requestfinished', (r) => {
    if (r.method() !== 'GET' && r.url().includes('/api/') && !r.url().includes('/api/auth/'))
      writes.push(`${r.method()} ${new URL(r.url()).pathname}`);
  });

  // The Wi-Fi drops; a reload still shows the round page, with its figures dated.
  await context.setOffline(true);
  await page.reload();
  await expect(page.getByRole('heading', { name: 'Round of readings' })).toBeVisible();
  await expect(page.getByTestId('offline-banner')).toContainText('No connection to the server');
  await expect(page.getByTestId('offline-banner')).toContainText('figures as of');

  // A round of two readings.
  await page.getByLabel(label(p1.label)).fill(String(p1.normalLow ?? p1.normalHigh ?? 1));
  await page.getByLabel(label(p2.label)).fill(String(p2.normalLow ?? p2.normalHigh ?? 1));
  await page.getByRole('button', { name: 'Save round' }).click();
  await expect(page.getByText('No connection — round kept on this tablet')).toBeVisible();

  // A checklist item and its photo.
  await page.goto(`/runs/${a.run.id}/checklists/${a.checklist.id}`);
  await expect(page.getByRole('heading', { name: 'Tablet round check' })).toBeVisible();
  await page.getByTestId('item-gauges-read').getByRole('button', { name: 'Mark done' }).click();
  await expect(page.getByTestId('waiting-gauges-read')).toContainText('Kept on this tablet');
  await page
    .getByTestId('item-board-photo')
    .locator('input[type=file]')
    .setInputFiles({ name: 'board.png', mimeType: 'image/png', buffer: PHOTO });
  await expect(page.getByTestId('waiting-board-photo')).toContainText('a photo');

  // An entry on run B, which is abandoned at the desk meanwhile: the server will refuse it.
  await page.goto(`/runs/${b.run.id}/checklists/${b.checklist.id}`);
  await page.getByTestId('item-gauges-read').getByRole('button', { name: 'Mark done' }).click();
  await expect(page.getByTestId('outbox-indicator')).toContainText('4 waiting');
  await ok<RunDetail>(
    request.post(`/api/runs/${b.run.id}/transitions`, { headers: auth(op), data: { to: 'abandoned', note: 'Boiler inspector called' } }),
  );

  // Reloaded offline: everything still waits (IndexedDB), and the start needs the server.
  await page.reload();
  await expect(page.getByRole('heading', { name: 'Tablet round check' })).toBeVisible();
  await expect(page.getByTestId('outbox-indicator')).toContainText('4 waiting');
  await page.getByTestId('outbox-indicator').click();
  await expect(page.getByTestId('outbox-oldest')).toContainText('Oldest kept');
  await page.getByRole('button', { name: 'Send now' }).click(); // still no network: nothing is lost
  await expect(page.getByTestId('outbox-indicator')).toContainText('4 waiting');
  expect(writes).toEqual([]);

  // The network returns: the tablet sends it all on its own, in order, once.
  await context.setOffline(false);
  await expect(page.getByTestId('outbox-indicator')).toContainText('1 refused');
  await expect(page.getByTestId('outbox-indicator')).not.toContainText('waiting');
  await expect(page.getByTestId('refused-reason')).toContainText(/abandoned/i);
  await expect(page.getByRole('alert').filter({ hasText: 'refused by the server' })).toContainText('Every gauge on the board read');

  expect(writes).toEqual([
    `POST /api/runs/${a.run.id}/rounds`,
    `PUT /api/checklists/${a.checklist.id}/items/gauges-read`,
    `PUT /api/checklists/${a.checklist.id}/items/board-photo/photo`,
    `PUT /api/checklists/${b.checklist.id}/items/gauges-read`,
  ]);

  // Stored once each.
  const readings = await ok<ReadingDto[]>(request.get(`/api/runs/${a.run.id}/readings`, { headers: auth(op) }));
  expect(readings.map((r) => r.pointId).sort()).toEqual([p1.id, p2.id].sort());
  const c = await ok<ChecklistDetail>(request.get(`/api/checklists/${a.checklist.id}`, { headers: auth(op) }));
  const entry = (k: string) => c.entries.find((e) => e.itemKey === k);
  expect(entry('gauges-read')?.done).toBe(true);
  expect(entry('board-photo')?.hasPhoto).toBe(true);
  const cb = await ok<ChecklistDetail>(request.get(`/api/checklists/${b.checklist.id}`, { headers: auth(op) }));
  expect(cb.entries.find((e) => e.itemKey === 'gauges-read')?.done ?? false).toBe(false);

  // The refused item stays after a reload until dismissed.
  await page.reload();
  await expect(page.getByTestId('outbox-indicator')).toContainText('1 refused');
  await page.getByTestId('outbox-indicator').click();
  await page.getByRole('button', { name: 'Dismiss' }).click();
  await expect(page.getByTestId('outbox-indicator')).toHaveCount(0);
});

test('with no tab open, the service worker sends what waits on a Background Sync, under the sign-in cookie', async ({
  page,
  context,
  request,
}) => {
  test.setTimeout(120_000);
  const stamp = Date.now().toString(36);
  const chief = await token(request, 'chief@alderforge.example');
  const op = await token(request, 'operator@alderforge.example');
  const a = await engineWithRun(request, chief, op, `Closed tab engine ${stamp}`);
  const [p1] = [...a.engine.measurementPoints].sort((x, y) => x.sequence - y.sequence);

  await signIn(page, 'operator@alderforge.example');
  await controlled(page);
  await page.goto(`/runs/${a.run.id}/round`);
  await expect(page.getByLabel(label(p1.label))).toBeVisible();

  // Offline, a round is kept on the tablet; then the tab is closed before the network returns.
  await context.setOffline(true);
  await page.getByLabel(label(p1.label)).fill(String(p1.normalLow ?? p1.normalHigh ?? 1));
  await page.getByRole('button', { name: 'Save round' }).click();
  await expect(page.getByText('No connection — round kept on this tablet')).toBeVisible();
  await page.close();
  await context.setOffline(false);

  // The browser's Background Sync fires with no window of the app open (a blank page is no client of the app).
  const blank = await context.newPage();
  const cdp = await context.newCDPSession(blank);
  const registrations: { registrationId: string; scopeURL: string }[] = [];
  cdp.on('ServiceWorker.workerRegistrationUpdated', (e) => registrations.push(...e.registrations));
  await cdp.send('ServiceWorker.enable');
  await expect.poll(() => registrations.length).toBeGreaterThan(0);
  const origin = new URL(registrations[0].scopeURL).origin;
  await cdp.send('ServiceWorker.dispatchSyncEvent', {
    origin,
    registrationId: registrations[0].registrationId,
    tag: 'cj-outbox',
    lastChance: false,
  });

  await expect
    .poll(
      async () => (await ok<ReadingDto[]>(request.get(`/api/runs/${a.run.id}/readings`, { headers: auth(op) }))).map((r) => r.pointId),
      {
        timeout: 20_000,
      },
    )
    .toEqual([p1.id]);

  // Opened again: nothing waits.
  const again = await context.newPage();
  await again.goto(`/runs/${a.run.id}/round`);
  await expect(again.getByRole('heading', { name: 'Round of readings' })).toBeVisible();
  await expect(again.getByTestId('outbox-indicator')).toHaveCount(0);
});
