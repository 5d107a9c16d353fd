import { expect, test, type APIRequestContext } from '@playwright/test';
import type { LotDetail, MillDto, QuoteDto, TokenPair } from '@crankjournal/shared-types';
import { DEMO_PASSWORD, signIn, waitForMail } from './helpers';

const SHOTS = process.env.SCREENSHOT_DIR ?? '../.data/test-results/screens';

async function login(request: APIRequestContext, email: string): Promise<TokenPair> {
  const r = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(r.ok()).toBeTruthy();
  return (await r.json()) as TokenPair;
}

/** A lot of its own whose quote the customer has accepted (ordered), made through the API as the mill lead. */
async function orderedLot(request: APIRequestContext): Promise<{ lot: LotDetail; email: string }> {
  const lead = await login(request, 'mill@alderforge.example');
  const headers = { authorization: `Bearer ${lead.accessToken}` };
  const mills = (await (await request.get('/api/mill/mills', { headers })).json()) as MillDto[];
  const mill = mills.find((m) => m.name === 'Alder Forge bar mill');
  expect(mill, 'the demo mill is seeded').toBeTruthy();
  const email = `buyer-${Date.now().toString(36)}@browser.crankjournal.test`;
  const made = await request.post('/api/mill/lots', {
    headers,
    data: {
      customerName: 'Browser test smithy',
      customerEmail: email,
      productShape: 'square',
      productHeightMm: 50.8,
      productWidthMm: 50.8,
      steelGrade: 'Mild steel',
      quantityTonnes: 2,
      dueDate: '2027-06-30',
      millId: mill!.id,
    },
  });
  expect(made.status(), await made.text()).toBe(201);
  const lot = (await made.json()) as LotDetail;
  const quoted = await request.post(`/api/mill/lots/${lot.id}/quotes`, { headers, data: { engineHours: 4, crewHours: 6 } });
  expect(quoted.status(), await quoted.text()).toBe(201);
  const quote = (await quoted.json()) as QuoteDto;
  expect((await request.post(`/api/mill/quotes/${quote.id}/send`, { headers, data: {} })).status()).toBe(200);
  const ordered = await request.post(`/api/mill/lots/${lot.id}/transitions`, { headers, data: { to: 'ordered' } });
  expect(ordered.status(), await ordered.text()).toBe(200);
  return { lot, email };
}

test('the mill lead asks for a deposit; the customer pays on the payment page; the lot shows as paid, live', async ({
  page,
  browser,
  request,
}) => {
  test.setTimeout(120_000);
  const { lot, email } = await orderedLot(request);

  await signIn(page, 'mill@alderforge.example');
  await page.goto(`/mill/lots/${lot.id}`);
  await expect(page.getByRole('heading', { name: 'Money' })).toBeVisible();
  await page.getByRole('button', { name: 'Ask for the deposit' }).click();
  await page.getByRole('dialog').getByRole('button', { name: 'Send the payment link' }).click();
  const row = page.getByTestId('payment-deposit');
  await expect(row).toContainText('Asked');
  const sum = (await row.locator('td').nth(1).innerText()).trim();
  expect(sum).toMatch(/^[£$]\d/);

  // The lead's page stays as it is from here on: a mark on the window would not survive a reload, and the
  // lot's money is not asked of the server again (it comes through the live channel).
  await page.evaluate(() => ((window as Window & { notReloaded?: boolean }).notReloaded = true));
  const moneyReads: string[] = [];
  page.on('request', (r) => {
    if (r.method() === 'GET' && r.url().includes(`/api/payments/lots/${lot.id}`)) moneyReads.push(r.url());
  });

  // The customer's e-mail carries the payment link; the customer opens it in a browser of their own.
  const mail = await waitForMail(email, 15_000, /^Deposit for lot/);
  const link = /(https?:\/\/\S+\/pay\/\w+)/.exec(mail.text)?.[1];
  expect(link, mail.text).toBeTruthy();
  const customer = await browser.newContext();
  try {
    const pay = await customer.newPage();
    await pay.goto(link!);
    await expect(pay.getByText(`Deposit for lot ${lot.reference}`)).toBeVisible();
    await pay.getByLabel('Card number').fill('4242 4242 4242 4242');
    await pay.getByLabel('Expiry').fill('12 / 30');
    await pay.getByLabel('CVC').fill('123');
    await pay.screenshot({ path: `${SHOTS}/payments-standin-checkout.png` });
    await pay.getByRole('button', { name: `Pay ${sum}` }).click();
    await expect(pay.getByText('Thank you. We will e-mail you a receipt.')).toBeVisible();
  } finally {
    await customer.close();
  }

  // The mill lead's page, not reloaded, shows the deposit paid.
  await expect(row).toContainText('Paid');
  await expect(page.getByTestId('money-paid')).toHaveText(sum);
  await expect(page.getByRole('button', { name: 'Ask for the deposit' })).toHaveCount(0);
  expect(await page.evaluate(() => (window as Window & { notReloaded?: boolean }).notReloaded)).toBe(true);
  expect(moneyReads).toEqual([]);
  await page.getByRole('heading', { name: 'Money' }).scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/payments-lot-paid.png` });
  // And the customer has the receipt.
  expect((await waitForMail(email, 15_000, /^Receipt: deposit/)).subject).toContain(lot.reference);
});

test('the administrator finds a lot with money outstanding and opens it', async ({ page, request }) => {
  const { lot } = await orderedLot(request);
  await signIn(page, 'admin@alderforge.example');
  await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Money outstanding' }).click();
  await expect(page.getByRole('heading', { name: 'Money outstanding' })).toBeVisible();
  const table = page.getByRole('table', { name: 'Lots with money outstanding' });
  const row = table.getByRole('row').filter({ has: page.getByRole('link', { name: lot.reference }) });
  await expect(row).toContainText('Nothing asked yet');
  await expect(row.getByTestId(`due-${lot.reference}`)).toHaveText(/^[£$][\d,]+\.\d{2}$/);
  await page.screenshot({ path: `${SHOTS}/payments-outstanding.png` });
  await row.getByRole('link', { name: lot.reference }).click();
  await expect(page).toHaveURL(new RegExp(`/mill/lots/${lot.id}$`));
  await expect(page.getByRole('heading', { name: 'Money' })).toBeVisible();
});
