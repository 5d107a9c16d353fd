import { expect, test } from '@playwright/test';
import { signIn, signOut, waitForMail } from './helpers';

test('operator signs in, sees the shell and an operator’s navigation, signs out', async ({ page }) => {
  await signIn(page, 'operator@alderforge.example');
  await expect(page.getByTestId('signed-in-role')).toHaveText('Engine operator');
  const nav = page.getByRole('navigation', { name: 'Main navigation' });
  await expect(nav.getByRole('link', { name: 'Today' })).toBeVisible();
  await expect(nav.getByRole('link', { name: 'People and roles' })).toHaveCount(0);
  await page.goto('/admin/users');
  await expect(page.getByRole('heading', { name: 'No such page' })).toBeVisible();
  await signOut(page);
});

test('administrator invites a person, who sets a password from the e-mail', async ({ page }) => {
  const email = `new.hand.${Date.now()}@alderforge.example`;
  await signIn(page, 'admin@alderforge.example');
  await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'People and roles' }).click();
  await page.getByRole('button', { name: 'Invite a person' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('E-mail').fill(email);
  await dialog.getByLabel('Name').fill('Ivo Penhallow');
  await dialog.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByRole('cell', { name: email })).toBeVisible();
  const mail = await waitForMail(email);
  const link = /https?:\/\/\S+\/set-password\?token=\S+/.exec(mail.text)?.[0];
  expect(link).toBeTruthy();
  await signOut(page);
  await page.goto(new URL(link!).pathname + new URL(link!).search);
  await page.getByLabel('New password').fill('a long enough sentence');
  await page.getByLabel('Repeat it').fill('a long enough sentence');
  await page.getByRole('button', { name: 'Set password and sign in' }).click();
  await expect(page.getByTestId('signed-in-name')).toHaveText('Ivo Penhallow');
});
