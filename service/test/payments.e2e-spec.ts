import { randomUUID } from 'node:crypto';
import { jest } from '@jest/globals';
import Stripe from 'stripe';
import type { Socket } from 'socket.io-client';
import {
  MONEY_ROOM,
  type EngineDetail,
  type LotDetail,
  type LotMoney,
  type MillDto,
  type OutstandingLot,
  type QuoteDto,
} from '@crankjournal/shared-types';
import { paymentClient } from '../src/modules/payments/payments.service.js';
import { MailService, type OutgoingMail } from '../src/modules/mail/mail.service.js';
import { STANDIN_PAYMENTS_API_KEY, STANDIN_PAYMENTS_WEBHOOK_SECRET } from '../src/config/env.validation.js';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createMill, createMillRun, millEngine } from './factories/mill.factory.js';
import { waitForMessage } from './utils/mail-inbox.js';
import { connected, socketAs } from './utils/socket.js';
import { inspectPdf } from './utils/pdf-inspect.js';

const PAYS = '4242 4242 4242 4242';
const DECLINES = '4000 0000 0000 0002';

/** The customer on the stand-in's hosted page, as a browser would post its form. */
const payOnPage = (url: string, card: string) =>
  fetch(url, { method: 'POST', body: new URLSearchParams({ card, expiry: '12 / 30', cvc: '123' }), redirect: 'manual' });

describe('payments for customer lots (API, against the payment stand-in)', () => {
  let t: TestApp;
  let chief: SignedIn;
  let lead: SignedIn;
  let admin: SignedIn;
  let observer: SignedIn;
  let operator: SignedIn;
  let maintenance: SignedIn;
  let engine: EngineDetail;
  let mill: MillDto;
  let client: Stripe;
  let endpointId: string;

  beforeAll(async () => {
    t = await startTestApp();
    [chief, lead, admin, observer, operator, maintenance] = await Promise.all(
      (['chief_engineer', 'mill_lead', 'administrator', 'observer', 'operator', 'maintenance_lead'] as const).map((r) => login(t, r)),
    );
    engine = await millEngine(t, chief.accessToken);
    mill = await createMill(t, chief.accessToken, engine.id);
    // The payment service sends events to the endpoints registered with it: this app's webhook for this file.
    client = paymentClient(STANDIN_PAYMENTS_API_KEY, process.env.PAYMENTS_API_URL!);
    endpointId = (await client.webhookEndpoints.create({ url: `${t.url}/api/payments/webhook`, enabled_events: ['*'] })).id;
  }, 120_000);
  afterAll(async () => {
    if (endpointId) await client.webhookEndpoints.del(endpointId);
    await t?.close();
  });

  const money = async (lotId: string) => (await signedIn(t, observer).get(`/api/payments/lots/${lotId}`)).body as LotMoney;
  const lotOf = async (lotId: string) => (await signedIn(t, observer).get(`/api/mill/lots/${lotId}`)).body as LotDetail;

  /** A lot with a quote sent to its customer. */
  async function quotedLot(): Promise<{ lot: LotDetail; quote: QuoteDto; email: string }> {
    const email = `buyer-${randomUUID().slice(0, 8)}@e2e.crankjournal.test`;
    const lot = (
      await signedIn(t, lead).post('/api/mill/lots').send({
        customerName: 'Test smithy',
        customerEmail: email,
        productShape: 'square',
        productHeightMm: 50.8,
        productWidthMm: 50.8,
        steelGrade: 'Mild steel',
        quantityTonnes: 4,
        dueDate: '2027-05-31',
        millId: mill.id,
      })
    ).body as LotDetail;
    const quote = (await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/quotes`).send({ engineHours: 5, crewHours: 8 })).body as QuoteDto;
    expect((await signedIn(t, lead).post(`/api/mill/quotes/${quote.id}/send`).send({})).status).toBe(200);
    return { lot, quote, email };
  }

  /** An event signed as the payment service signs them (the SDK's own test header), posted to our webhook. */
  async function postEvent(event: Record<string, unknown>, secret = STANDIN_PAYMENTS_WEBHOOK_SECRET) {
    const payload = JSON.stringify(event);
    const header = client.webhooks.generateTestHeaderString({ payload, secret });
    return t.http.post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', header).send(payload);
  }

  it('deposit asked, e-mailed with the quote, declined once, paid with the test card; roll plan; balance; refund', async () => {
    const { lot, quote, email } = await quotedLot();
    const quotedMinor = Math.round(quote.total * 100);
    const unpaid = await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/transitions`).send({ to: 'ordered' });
    expect(unpaid.status).toBe(200);

    const asked = await signedIn(t, lead).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'deposit' });
    expect(asked.status).toBe(201);
    const m1 = asked.body as LotMoney;
    expect(m1.quotedMinor).toBe(quotedMinor);
    expect(m1.payments).toHaveLength(1);
    const [p] = m1.payments;
    // The site's default share, 30 %, of the quote, rounded to the penny.
    expect(p.amountMinor).toBe(Math.round(quotedMinor * 0.3));
    expect(p).toMatchObject({ kind: 'deposit', state: 'asked', currency: quote.currency, emailedTo: email });
    expect(p.checkoutUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/pay\/cs_test_/);
    const again = await signedIn(t, lead).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'deposit' });
    expect(again.status).toBe(409);

    const mail = await waitForMessage(email, { subject: /Deposit for lot/ });
    expect(mail.text).toContain(p.checkoutUrl!);
    expect(mail.attachments.map((a) => a.contentType)).toEqual(['application/pdf']);

    const page = await fetch(p.checkoutUrl!);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('Card number');

    const declined = await payOnPage(p.checkoutUrl!, DECLINES);
    expect(declined.status).toBe(402);
    const m2 = await money(lot.id);
    expect(m2.payments[0]).toMatchObject({ state: 'asked', declineReason: expect.stringMatching(/declined/) as unknown });
    expect(m2.depositPaid).toBe(false);
    const stillUnpaid = await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/transitions`).send({ to: 'on_roll_plan' });
    expect(stillUnpaid.status).toBe(409);

    const paid = await payOnPage(p.checkoutUrl!, PAYS);
    expect(paid.status).toBe(303);
    const m3 = await money(lot.id);
    expect(m3.payments[0]).toMatchObject({ state: 'paid', declineReason: null, checkoutUrl: null });
    expect(m3.depositPaid).toBe(true);
    expect(m3.paidMinor).toBe(p.amountMinor);
    expect(m3.dueMinor).toBe(quotedMinor - p.amountMinor);
    const receipt = await waitForMessage(email, { subject: /Receipt: deposit/ });
    expect(receipt.attachments[0]?.filename).toMatch(/^receipt-.*\.pdf$/);

    const run = await createMillRun(t, chief.accessToken, engine.id);
    expect((await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/runs`).send({ runId: run.id })).status).toBe(200);
    expect((await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/transitions`).send({ to: 'on_roll_plan' })).status).toBe(200);

    // Dispatched, then the balance: the quote less the deposit; settled when paid.
    expect((await signedIn(t, lead).patch(`/api/mill/lots/${lot.id}`).send({ producedTonnes: 3.9 })).status).toBe(200);
    for (const to of ['rolled', 'passed', 'dispatched'])
      expect((await signedIn(t, lead).post(`/api/mill/lots/${lot.id}/transitions`).send({ to })).status).toBe(200);
    const outstanding = (await signedIn(t, admin).get('/api/payments/outstanding')).body as OutstandingLot[];
    expect(outstanding.find((o) => o.lotId === lot.id)?.dueMinor).toBe(quotedMinor - p.amountMinor);
    const balance = await signedIn(t, admin).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'balance' });
    expect(balance.status).toBe(201);
    const b = (balance.body as LotMoney).payments.find((x) => x.kind === 'balance')!;
    expect(b.amountMinor).toBe(quotedMinor - p.amountMinor);
    expect((await payOnPage(b.checkoutUrl!, PAYS)).status).toBe(303);
    const m4 = await money(lot.id);
    expect(m4).toMatchObject({ settled: true, dueMinor: 0, paidMinor: quotedMinor });
    expect(((await signedIn(t, admin).get('/api/payments/outstanding')).body as OutstandingLot[]).some((o) => o.lotId === lot.id)).toBe(
      false,
    );

    // A refund of part of the deposit, by the administrator only, with a reason.
    const deposit = m4.payments.find((x) => x.kind === 'deposit')!;
    expect(
      (await signedIn(t, lead).post(`/api/payments/${deposit.id}/refunds`).send({ amountMinor: 500, reason: 'Short weight' })).status,
    ).toBe(403);
    expect((await signedIn(t, admin).post(`/api/payments/${deposit.id}/refunds`).send({ amountMinor: 500 })).status).toBe(400);
    const tooMuch = await signedIn(t, admin)
      .post(`/api/payments/${deposit.id}/refunds`)
      .send({ amountMinor: deposit.amountMinor + 1, reason: 'Too much' });
    expect(tooMuch.status).toBe(400);
    const refunded = await signedIn(t, admin)
      .post(`/api/payments/${deposit.id}/refunds`)
      .send({ amountMinor: 500, reason: 'Short weight' });
    expect(refunded.status).toBe(200);
    const m5 = refunded.body as LotMoney;
    expect(m5.refundedMinor).toBe(500);
    expect(m5.dueMinor).toBe(500);
    expect(m5.payments.find((x) => x.id === deposit.id)!.refunds).toMatchObject([{ amountMinor: 500, reason: 'Short weight' }]);
  });

  it('a replayed or out-of-order event changes nothing twice; a bad signature gets 400 and changes nothing', async () => {
    const { lot } = await quotedLot();
    const p = (
      (await signedIn(t, admin).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'deposit', amountMinor: 5000 })).body as LotMoney
    ).payments[0];
    expect(p.amountMinor).toBe(5000);
    const session = await client.checkout.sessions.retrieve(p.checkoutUrl!.split('/').pop()!);
    const failed = (id: string, message: string) => ({
      id,
      object: 'event',
      type: 'payment_intent.payment_failed',
      created: Math.floor(Date.now() / 1000),
      data: { object: { id: 'pi_test_x', object: 'payment_intent', metadata: { paymentId: p.id }, last_payment_error: { message } } },
    });
    const first = await postEvent(failed('evt_test_replay_' + p.id.slice(0, 8), 'Insufficient funds.'));
    expect(first.status).toBe(200);
    expect(first.body).toEqual({ received: true, applied: true });
    const replay = await postEvent(failed('evt_test_replay_' + p.id.slice(0, 8), 'Something else.'));
    expect(replay.body).toEqual({ received: true, applied: false });
    expect((await money(lot.id)).payments[0].declineReason).toBe('Insufficient funds.');

    const completed = { ...session, payment_status: 'paid', status: 'complete', payment_intent: 'pi_test_forged' };
    const forged = {
      id: `evt_test_forged_${p.id.slice(0, 8)}`,
      object: 'event',
      type: 'checkout.session.completed',
      created: 0,
      data: { object: completed },
    };
    const bad = await postEvent(forged, 'whsec_not_ours');
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/not signed with our webhook secret/);
    const unsigned = await t.http.post('/api/payments/webhook').set('content-type', 'application/json').send(JSON.stringify(forged));
    expect(unsigned.status).toBe(400);
    expect((await money(lot.id)).payments[0].state).toBe('asked');

    // Paid, then a late "failed" event: the payment stays paid.
    expect((await payOnPage(p.checkoutUrl!, PAYS)).status).toBe(303);
    expect((await postEvent(failed(`evt_test_late_${p.id.slice(0, 8)}`, 'Too late.'))).body).toEqual({ received: true, applied: true });
    expect((await money(lot.id)).payments[0]).toMatchObject({ state: 'paid', declineReason: null });
    expect((await lotOf(lot.id)).status).toBe('ordered');
  });

  it("a lot's money goes live to the money room: the mill lead and the observer get it, operators and maintenance never", async () => {
    const sockets: Socket[] = [lead, observer, operator, maintenance].map((who) => socketAs(t.url, who));
    // Every e-mail the app sends, as it hands it to its queue (the spy calls through: the e-mails still go out).
    const spy = jest.spyOn(t.app.get(MailService), 'send');
    const sent = (): OutgoingMail[] => spy.mock.calls.map((c) => c[0]);
    try {
      await Promise.all(sockets.map((s) => connected(s)));
      const [leadS, observerS, operatorS, maintenanceS] = sockets;
      for (const s of [leadS, observerS])
        expect(await s.timeout(5000).emitWithAck('room:join', { room: MONEY_ROOM })).toEqual({ ok: true, room: MONEY_ROOM });
      for (const s of [operatorS, maintenanceS])
        expect(await s.timeout(5000).emitWithAck('room:join', { room: MONEY_ROOM })).toMatchObject({ ok: false, status: 403 });
      const crewHeard: string[] = [];
      for (const s of [operatorS, maintenanceS]) s.onAny((event: string) => crewHeard.push(event));
      const heard = new Map<Socket, LotMoney[]>([
        [leadS, []],
        [observerS, []],
      ]);
      for (const [s, list] of heard) s.on('lot:money', (m: LotMoney) => list.push(m));
      /** Waits until `s` has heard this lot's money in a state `ok` accepts. */
      const hears = async (s: Socket, lotId: string, ok: (m: LotMoney) => boolean) => {
        const until = Date.now() + 10_000;
        for (;;) {
          const m = heard.get(s)!.find((x) => x.lotId === lotId && ok(x));
          if (m) return m;
          if (Date.now() > until) throw new Error(`no lot:money for ${lotId} in the state looked for within 10 s`);
          await new Promise((r) => setTimeout(r, 50));
        }
      };

      const { lot, email, quote: q } = await quotedLot();
      const p = ((await signedIn(t, lead).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'deposit' })).body as LotMoney)
        .payments[0];
      expect((await hears(observerS, lot.id, (m) => m.payments[0]?.state === 'asked')).askedMinor).toBe(p.amountMinor);

      // The customer's card is declined, then the test card pays: each event reaches the room at once.
      expect((await payOnPage(p.checkoutUrl!, DECLINES)).status).toBe(402);
      const declined = await hears(leadS, lot.id, (m) => !!m.payments[0]?.declineReason);
      expect(declined.payments[0].declineReason).toMatch(/declined/);
      expect((await payOnPage(p.checkoutUrl!, PAYS)).status).toBe(303);
      const paid = await hears(leadS, lot.id, (m) => m.depositPaid);
      expect(paid).toMatchObject({ paidMinor: p.amountMinor, askedMinor: 0 });
      expect(paid.payments[0]).toMatchObject({ state: 'paid', checkoutUrl: null });
      await hears(observerS, lot.id, (m) => m.depositPaid);

      // A refund by the administrator reaches the room too.
      const refunded = await signedIn(t, admin).post(`/api/payments/${p.id}/refunds`).send({ amountMinor: 100, reason: 'Rounding agreed' });
      expect(refunded.status).toBe(200);
      expect((await hears(leadS, lot.id, (m) => m.refundedMinor === 100)).dueMinor).toBe((refunded.body as LotMoney).dueMinor);

      // Operators and maintenance heard no money at all (the room's events arrived above before this check).
      await new Promise((r) => setTimeout(r, 300));
      expect(crewHeard.filter((e) => e === 'lot:money')).toEqual([]);

      // The receipt e-mailed for the payment, read as text: the lot, the sum in its currency, when, and no card data.
      await waitForMessage(email, { subject: /Receipt: deposit/ });
      const receiptMail = sent().find((m) => m.to === email && m.subject.startsWith('Receipt'))!;
      expect(receiptMail.attachments).toHaveLength(1);
      const receipt = inspectPdf(receiptMail.attachments![0].content);
      const amount = new Intl.NumberFormat('en-GB', { style: 'currency', currency: p.currency }).format(p.amountMinor / 100);
      expect(receipt.text).toContain(`Receipt: deposit for lot ${lot.reference}`);
      expect(receipt.text).toContain(amount);
      expect(receipt.text).toContain(`${p.currency} (`);
      expect(receipt.text).toMatch(/received \d{2} [A-Z][a-z]{2} \d{4} \d{2}:\d{2} [A-Z]{3,4}/);
      expect(receipt.text).not.toMatch(/4242 ?4242|4000 ?0000|\b\d{4} ?\d{4} ?\d{4} ?\d{4}\b|card number|CVC|expiry/i);
      // The request for the deposit carried the quote: its PDF names the lot and the quote's total.
      const request = sent().find((m) => m.to === email && m.subject.startsWith('Deposit for lot'))!;
      const quote = inspectPdf(request.attachments![0].content);
      expect(quote.text).toContain(lot.reference);
      expect(quote.text).toContain(new Intl.NumberFormat('en-GB', { style: 'currency', currency: q.currency }).format(q.total));
      expect(quote.text).not.toMatch(/4242 ?4242/);
    } finally {
      spy.mockRestore();
      for (const s of sockets) s.disconnect();
    }
  });

  it('who may see and move money', async () => {
    const { lot, quote } = await quotedLot();
    for (const who of [operator, maintenance]) {
      expect((await signedIn(t, who).get(`/api/payments/lots/${lot.id}`)).status).toBe(403);
      expect((await signedIn(t, who).get(`/api/mill/lots/${lot.id}/quotes`)).status).toBe(403);
      expect((await signedIn(t, who).get(`/api/mill/quotes/${quote.id}/quote.pdf`)).status).toBe(403);
      const seen = (await signedIn(t, who).get(`/api/mill/lots/${lot.id}`)).body as LotDetail;
      expect(seen.latestQuoteTotal).toBeNull();
      expect(seen.quotes).toEqual([]);
      const list = (await signedIn(t, who).get('/api/mill/lots')).body as LotDetail[];
      expect(list.every((l) => l.latestQuoteTotal === null)).toBe(true);
    }
    expect((await signedIn(t, observer).get(`/api/payments/lots/${lot.id}`)).status).toBe(200);
    expect(((await signedIn(t, observer).get(`/api/mill/lots/${lot.id}`)).body as LotDetail).latestQuoteTotal).toBe(quote.total);
    for (const who of [observer, chief, operator])
      expect((await signedIn(t, who).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'deposit' })).status).toBe(403);
    expect((await signedIn(t, lead).get('/api/payments/outstanding')).status).toBe(403);
    expect((await signedIn(t, lead).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'deposit', sharePct: 150 })).status).toBe(
      400,
    );
    const balanceEarly = await signedIn(t, lead).post(`/api/payments/lots/${lot.id}/requests`).send({ kind: 'balance' });
    expect(balanceEarly.status).toBe(409);
    expect(balanceEarly.body.message).toMatch(/after dispatch/);
    expect((await t.http.get(`/api/payments/lots/${lot.id}`)).status).toBe(401);
  });
});
