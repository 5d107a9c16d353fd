import AxeBuilder from '@axe-core/playwright';
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import type { RunSummary } from '@crankjournal/shared-types';
import { DEMO_PASSWORD, signIn } from './helpers';

/**
 * Our look on the screens the crew use most, at the tablet and the desktop size, in both schemes: a screenshot of each
 * (in .data/test-results/screens) and an accessibility check (axe-core, WCAG 2 A and AA rules) with no serious or
 * critical finding.
 */
const SIZES = [
  { width: 1024, height: 768 },
  { width: 1440, height: 900 },
] as const;
const SCHEMES = ['light', 'dark'] as const;
const SHOTS = process.env.SCREENSHOT_DIR ?? '../.data/test-results/screens';

async function runs(request: APIRequestContext): Promise<RunSummary[]> {
  const login = await request.post('/api/auth/login', { data: { email: 'chief@alderforge.example', password: DEMO_PASSWORD } });
  const { accessToken } = (await login.json()) as { accessToken: string };
  const r = await request.get('/api/runs', { headers: { authorization: `Bearer ${accessToken}` } });
  expect(r.ok()).toBeTruthy();
  const body = (await r.json()) as RunSummary[] | { items: RunSummary[] };
  return Array.isArray(body) ? body : body.items;
}

async function check(page: Page, name: string, size: string, scheme: string) {
  await page.waitForLoadState('networkidle');
  await page.screenshot({ path: `${SHOTS}/${name}-${size}-${scheme}.png`, fullPage: false });
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
  expect(bad, `${name} at ${size} in the ${scheme} scheme`).toEqual([]);
}

for (const vp of SIZES) {
  for (const scheme of SCHEMES) {
    const size = `${vp.width}x${vp.height}`;
    test.describe(`${size}, ${scheme} scheme`, () => {
      test.use({ viewport: vp });
      test.beforeEach(async ({ page }) => {
        await page.addInitScript((s) => window.localStorage.setItem('mantine-color-scheme-value', s), scheme);
      });

      test('shift board, live run, round entry, a checklist and bearing history look like ours', async ({ page, request }) => {
        const all = await runs(request);
        const closed = all.find((r) => r.state === 'closed')!;
        // The next run of the demo; other browser tests may already have started it, so any open run will do.
        const next =
          all.find((r) => r.state === 'preparing' || r.state === 'planned' || r.state === 'cleared') ??
          all.find((r) => r.state !== 'closed' && r.state !== 'abandoned')!;
        await signIn(page, 'chief@alderforge.example');
        await expect(page.locator('html')).toHaveAttribute('data-mantine-color-scheme', scheme);

        await page.goto('/');
        await expect(page.getByRole('heading', { name: 'Shift board' })).toBeVisible();
        await expect(page.getByTestId('engine-state')).toBeVisible();
        await check(page, 'shift-board', size, scheme);

        await page.goto(`/runs/${closed.id}`);
        await expect(page.getByTestId(/^board-/).first()).toBeVisible();
        await check(page, 'run-board', size, scheme);

        await page.goto(`/runs/${next.id}/round`);
        await expect(page.getByRole('heading').first()).toBeVisible();
        await check(page, 'round-entry', size, scheme);

        // The first checklist of the next run: open it, or start it when nobody has yet (it stays open for the next pass).
        await page.goto(`/runs/${next.id}/checklists`);
        const open = page.getByRole('link', { name: /^(Continue|View)$/ }).or(page.getByRole('button', { name: 'Start checklist' }));
        await open.first().click();
        await expect(page.getByTestId(/^item-/).first()).toBeVisible();
        await check(page, 'checklist', size, scheme);

        await page.goto('/maintenance/bearings');
        await page.locator('a[href*="/maintenance/bearings/"]').first().click();
        await expect(page.getByRole('heading').first()).toBeVisible();
        await check(page, 'bearing-history', size, scheme);
      });
    });
  }
}
