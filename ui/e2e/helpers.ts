import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'crankjournal-demo';
export const MAIL_INBOX_URL = process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:8035';

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('signed-in-name')).toBeVisible();
}

export async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
}

/** Polls the local mail stand-in for a message to `to` (the latest one, or the latest whose subject matches). */
export async function waitForMail(to: string, timeoutMs = 10_000, subject?: RegExp): Promise<{ subject: string; text: string }> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const r = await fetch(`${MAIL_INBOX_URL}/messages?to=${encodeURIComponent(to)}`);
    const list = ((await r.json()) as { subject: string; text: string }[]).filter((m) => !subject || subject.test(m.subject));
    if (list.length) return list[list.length - 1];
    await new Promise((res) => setTimeout(res, 250));
  }
  throw new Error(`no mail for ${to} within ${timeoutMs} ms`);
}
