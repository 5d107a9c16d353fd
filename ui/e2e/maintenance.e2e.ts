import { expect, test } from '@playwright/test';
import { signIn } from './helpers';

test('the maintenance lead opens the warm bearing of the demo season, sees the flagged run and opens the follow-up inspection', async ({
  page,
}) => {
  await signIn(page, 'maintenance@alderforge.example');

  // The start screen carries what is due, overrun marked.
  const due = page.getByTestId('today-maintenance');
  await expect(due.getByRole('heading', { name: 'Maintenance due' })).toBeVisible();
  await expect(due.getByTestId('due-overrun').first()).toHaveText('Overrun');

  await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Bearings' }).click();
  // Other tests may describe engines of their own: take the demo engine's bearing.
  await page.getByRole('row').filter({ hasText: 'No. 2 engine' }).getByRole('link', { name: 'Main bearing 2 (flywheel side)' }).click();
  await expect(page.getByRole('heading', { name: 'Main bearing 2 (flywheel side)' })).toBeVisible();

  // The August run is flagged by the drift rule, and the rule is stated; the other runs are not flagged.
  const august = page.getByRole('row').filter({ hasText: 'August demonstration' });
  await expect(august).toHaveAttribute('data-flagged', 'true');
  await expect(august.getByTestId('drift-flag')).toHaveText('Drift');
  await expect(august.getByText('High-high')).toBeVisible();
  await expect(page.locator('tr[data-flagged="true"]')).toHaveCount(1);
  await expect(page.getByTestId('drift-rule')).toContainText('above the top of the band');

  // The follow-up inspection is on the same timeline.
  await page.getByTestId('bearing-timeline').getByRole('link', { name: 'Main bearing 2 after the August hot run' }).click();
  await expect(page.getByRole('heading', { name: 'Main bearing 2 after the August hot run' })).toBeVisible();
  await expect(page.getByText('3 out of tolerance')).toBeVisible();
  await expect(page.getByTestId('out-of-tolerance')).toHaveCount(3);
  await expect(page.getByTestId('findings')).toContainText('scored');
  await expect(page.getByRole('img', { name: /Top half of main bearing 2/ })).toBeVisible();
  await expect(page.getByRole('link', { name: /top half scraped and clearance reset/ }).first()).toBeVisible();
});
