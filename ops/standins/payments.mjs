#!/usr/bin/env node
// Local stand-in for the hosted payment service, on 127.0.0.1. It answers, in the service's own wire format
// (form-encoded requests, JSON objects with `object` and prefixed ids, errors as { error: { type, message } }),
// the calls our service and tests make through the `stripe` SDK:
//   POST /v1/checkout/sessions, GET /v1/checkout/sessions/:id, POST /v1/checkout/sessions/:id/expire,
//   POST /v1/refunds, GET /v1/refunds/:id, POST /v1/webhook_endpoints, DELETE /v1/webhook_endpoints/:id.
// It serves a hosted checkout page (GET /pay/:session) where card 4242 4242 4242 4242 pays and
// 4000 0000 0000 0002 is declined, and sends signed events (Stripe-Signature, the SDK's own test-header scheme)
// to the webhook URL given at start and to every endpoint registered through the API.
// State is kept in memory; an Idempotency-Key sent again answers the first answer.
import http from 'node:http';
import { randomBytes } from 'node:crypto';
import qs from 'qs';
import Stripe from 'stripe';

const arg = (name, dflt) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : dflt;
};
const port = Number(arg('port', 4242));
const apiKey = arg('api-key', 'sk_test_crankjournal_standin');
const webhookSecret = arg('webhook-secret', 'whsec_crankjournal_standin');
const startUrl = arg('webhook-url', '');

const PAYS = '4242424242424242';
const DECLINES = '4000000000000002';
const sdk = new Stripe(apiKey);

const id = (prefix) => `${prefix}_test_${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);
const base = `http://127.0.0.1:${port}`;

/** @type {Map<string, any>} */ const sessions = new Map();
/** @type {Map<string, any>} */ const intents = new Map();
/** @type {Map<string, any>} */ const refunds = new Map();
/** @type {Map<string, any>} */ const endpoints = new Map();
/** @type {Map<string, {status:number, body:any}>} */ const idempotent = new Map();
if (startUrl) endpoints.set('we_start', { id: 'we_start', object: 'webhook_endpoint', url: startUrl, status: 'enabled' });

class ApiError extends Error {
  constructor(status, type, message, param) {
    super(message);
    this.status = status;
    this.body = { error: { type, message, ...(param ? { param } : {}) } };
  }
}
const need = (cond, message, param) => {
  if (!cond) throw new ApiError(400, 'invalid_request_error', message, param);
};
const int = (v, param) => {
  const n = Number(v);
  need(v !== undefined && Number.isInteger(n) && n > 0, `Invalid integer: ${v}`, param);
  return n;
};

/** Sends an event to every endpoint, signed with the webhook secret; resolves when each has answered. */
async function emit(type, object) {
  const event = {
    id: id('evt'),
    object: 'event',
    api_version: Stripe.API_VERSION,
    created: now(),
    data: { object },
    livemode: false,
    pending_webhooks: endpoints.size,
    request: { id: null, idempotency_key: null },
    type,
  };
  const payload = JSON.stringify(event, null, 2);
  const header = sdk.webhooks.generateTestHeaderString({ payload, secret: webhookSecret });
  await Promise.all(
    [...endpoints.values()].map(async (e) => {
      try {
        const r = await fetch(e.url, {
          method: 'POST',
          headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': header },
          body: payload,
          signal: AbortSignal.timeout(10_000),
        });
        console.log(`payments: ${type} ${event.id} → ${e.url}: ${r.status}`);
      } catch (err) {
        console.log(`payments: ${type} ${event.id} → ${e.url}: ${err instanceof Error ? err.message : err}`);
      }
    }),
  );
  return event;
}

function createSession(p) {
  need(p.mode === 'payment', 'Only mode=payment is served by this stand-in.', 'mode');
  need(typeof p.success_url === 'string', 'Missing required param: success_url.', 'success_url');
  const items = Array.isArray(p.line_items) ? p.line_items : [];
  need(items.length > 0, 'Missing required param: line_items.', 'line_items');
  let total = 0;
  let currency = null;
  const lines = items.map((li, i) => {
    const pd = li.price_data ?? {};
    need(pd.currency, 'Missing required param: line_items[].price_data.currency.', `line_items[${i}][price_data][currency]`);
    const unit = int(pd.unit_amount, `line_items[${i}][price_data][unit_amount]`);
    const qty = int(li.quantity ?? 1, `line_items[${i}][quantity]`);
    currency = String(pd.currency).toLowerCase();
    total += unit * qty;
    return { name: pd.product_data?.name ?? 'Item', amount: unit * qty };
  });
  const s = {
    id: id('cs'),
    object: 'checkout.session',
    amount_subtotal: total,
    amount_total: total,
    cancel_url: p.cancel_url ?? null,
    client_reference_id: p.client_reference_id ?? null,
    created: now(),
    currency,
    customer_email: p.customer_email ?? null,
    expires_at: now() + 24 * 3600,
    livemode: false,
    metadata: p.metadata ?? {},
    mode: 'payment',
    payment_intent: null,
    payment_status: 'unpaid',
    status: 'open',
    success_url: p.success_url,
    url: null,
    _lines: lines,
    _intentMetadata: p.payment_intent_data?.metadata ?? {},
  };
  s.url = `${base}/pay/${s.id}`;
  sessions.set(s.id, s);
  return s;
}
const publicSession = (s) => Object.fromEntries(Object.entries(s).filter(([k]) => !k.startsWith('_')));

function intentFor(s) {
  if (s.payment_intent) return intents.get(s.payment_intent);
  const pi = {
    id: id('pi'),
    object: 'payment_intent',
    amount: s.amount_total,
    amount_received: 0,
    currency: s.currency,
    created: now(),
    last_payment_error: null,
    livemode: false,
    metadata: { ...s.metadata, ...s._intentMetadata },
    status: 'requires_payment_method',
  };
  intents.set(pi.id, pi);
  s.payment_intent = pi.id;
  return pi;
}

function createRefund(p) {
  need(p.payment_intent, 'Missing required param: payment_intent.', 'payment_intent');
  const pi = intents.get(p.payment_intent);
  if (!pi) throw new ApiError(404, 'invalid_request_error', `No such payment_intent: '${p.payment_intent}'`, 'payment_intent');
  need(pi.status === 'succeeded', `PaymentIntent ${pi.id} has not succeeded; nothing to refund.`, 'payment_intent');
  const refunded = [...refunds.values()].filter((r) => r.payment_intent === pi.id).reduce((a, r) => a + r.amount, 0);
  const amount = p.amount === undefined ? pi.amount_received - refunded : int(p.amount, 'amount');
  need(
    amount > 0 && amount <= pi.amount_received - refunded,
    `Refund amount (${amount}) is greater than what is left to refund.`,
    'amount',
  );
  const r = {
    id: id('re'),
    object: 'refund',
    amount,
    currency: pi.currency,
    created: now(),
    metadata: p.metadata ?? {},
    payment_intent: pi.id,
    reason: p.reason ?? null,
    status: 'succeeded',
  };
  refunds.set(r.id, r);
  return r;
}

function page(s, message = '') {
  const money = new Intl.NumberFormat('en-GB', { style: 'currency', currency: (s.currency ?? 'gbp').toUpperCase() });
  const esc = (t) => String(t).replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  const body =
    s.status === 'complete'
      ? '<p role="status">Paid. Thank you.</p>'
      : `<form method="post" action="/pay/${s.id}">
  <label for="card">Card number</label><input id="card" name="card" inputmode="numeric" autocomplete="off" required>
  <label for="expiry">Expiry</label><input id="expiry" name="expiry" placeholder="MM / YY">
  <label for="cvc">CVC</label><input id="cvc" name="cvc">
  <button type="submit">Pay ${esc(money.format(s.amount_total / 100))}</button></form>
  <p class="hint">Stand-in: ${PAYS.replace(/(\d{4})/g, '$1 ').trim()} pays, ${DECLINES.replace(/(\d{4})/g, '$1 ').trim()} is declined.</p>`;
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Checkout (stand-in)</title>
<style>body{font-family:sans-serif;max-width:28rem;margin:2rem auto;padding:0 1rem}
label,input,button{display:block;width:100%;margin:.3rem 0}
input,button{font-size:1.1rem;padding:.6rem}.error{color:#8b1a10}.hint{color:#555;font-size:.9rem}</style></head><body>
<h1>Checkout (stand-in)</h1><ul>${s._lines.map((l) => `<li>${esc(l.name)}: ${esc(money.format(l.amount / 100))}</li>`).join('')}</ul>
${message ? `<p class="error" role="alert">${esc(message)}</p>` : ''}${body}</body></html>`;
}

async function pay(s, card) {
  const number = String(card ?? '').replace(/\D/g, '');
  if (s.status !== 'open') return { status: 409, html: page(s, 'This checkout is no longer open.') };
  const pi = intentFor(s);
  if (number === PAYS) {
    pi.status = 'succeeded';
    pi.amount_received = pi.amount;
    pi.last_payment_error = null;
    s.status = 'complete';
    s.payment_status = 'paid';
    await emit('payment_intent.succeeded', { ...pi });
    await emit('checkout.session.completed', publicSession(s));
    return { redirect: String(s.success_url).replace('{CHECKOUT_SESSION_ID}', s.id) };
  }
  if (number === DECLINES) {
    pi.status = 'requires_payment_method';
    pi.last_payment_error = {
      type: 'card_error',
      code: 'card_declined',
      decline_code: 'generic_decline',
      message: 'Your card was declined.',
    };
    await emit('payment_intent.payment_failed', { ...pi });
    return { status: 402, html: page(s, 'Your card was declined.') };
  }
  return { status: 400, html: page(s, `Use a test card: ${PAYS} pays, ${DECLINES} is declined.`) };
}

async function api(req, form) {
  const auth = req.headers.authorization ?? '';
  if (auth !== `Bearer ${apiKey}`) throw new ApiError(401, 'invalid_request_error', 'Invalid API Key provided.');
  const path = new URL(req.url ?? '/', base).pathname;
  const m = (re) => path.match(re);
  let hit;
  if (req.method === 'POST' && path === '/v1/checkout/sessions') return publicSession(createSession(form));
  if (req.method === 'GET' && (hit = m(/^\/v1\/checkout\/sessions\/([\w]+)$/))) {
    const s = sessions.get(hit[1]);
    if (!s) throw new ApiError(404, 'invalid_request_error', `No such checkout.session: '${hit[1]}'`, 'id');
    return publicSession(s);
  }
  if (req.method === 'POST' && (hit = m(/^\/v1\/checkout\/sessions\/([\w]+)\/expire$/))) {
    const s = sessions.get(hit[1]);
    if (!s) throw new ApiError(404, 'invalid_request_error', `No such checkout.session: '${hit[1]}'`, 'id');
    need(s.status === 'open', `Only open sessions can be expired; this one is ${s.status}.`);
    s.status = 'expired';
    await emit('checkout.session.expired', publicSession(s));
    return publicSession(s);
  }
  if (req.method === 'POST' && path === '/v1/refunds') {
    const r = createRefund(form);
    await emit('refund.created', r);
    return r;
  }
  if (req.method === 'GET' && (hit = m(/^\/v1\/refunds\/([\w]+)$/))) {
    const r = refunds.get(hit[1]);
    if (!r) throw new ApiError(404, 'invalid_request_error', `No such refund: '${hit[1]}'`, 'id');
    return r;
  }
  if (req.method === 'POST' && path === '/v1/webhook_endpoints') {
    need(typeof form.url === 'string' && /^https?:\/\//.test(form.url), 'Missing required param: url.', 'url');
    const e = { id: id('we'), object: 'webhook_endpoint', url: form.url, status: 'enabled', secret: webhookSecret };
    endpoints.set(e.id, { ...e, secret: undefined });
    return e;
  }
  if (req.method === 'DELETE' && (hit = m(/^\/v1\/webhook_endpoints\/([\w]+)$/))) {
    need(endpoints.delete(hit[1]), `No such webhook_endpoint: '${hit[1]}'`, 'id');
    return { id: hit[1], object: 'webhook_endpoint', deleted: true };
  }
  throw new ApiError(404, 'invalid_request_error', `Unrecognized request URL (${req.method}: ${path}).`);
}

const read = (req) =>
  new Promise((resolve, reject) => {
    const chunks = [];
    let size = 0;
    req.on('data', (c) => {
      size += c.length;
      if (size > 1024 * 1024) reject(new ApiError(413, 'invalid_request_error', 'Request too large.'));
      else chunks.push(c);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });

const server = http.createServer((req, res) => {
  const send = (status, type, body, headers = {}) => {
    res.writeHead(status, { 'content-type': type, ...headers });
    res.end(body);
  };
  (async () => {
    const path = new URL(req.url ?? '/', base).pathname;
    const text = await read(req);
    const form = qs.parse(text, { depth: 6, arrayLimit: 100 });
    const pageHit = path.match(/^\/pay\/([\w]+)$/);
    if (pageHit) {
      const s = sessions.get(pageHit[1]);
      if (!s) return send(404, 'text/html; charset=utf-8', '<!doctype html><title>Not found</title><p>No such checkout.</p>');
      if (req.method === 'GET') return send(200, 'text/html; charset=utf-8', page(s));
      if (req.method === 'POST') {
        const out = await pay(s, form.card);
        if (out.redirect) return send(303, 'text/plain', `See ${out.redirect}`, { location: out.redirect });
        return send(out.status ?? 200, 'text/html; charset=utf-8', out.html ?? '');
      }
    }
    if (path === '/health') return send(200, 'application/json', '{"ok":true}');
    if (!path.startsWith('/v1/')) return send(404, 'text/plain', 'Not found');
    const key = req.headers['idempotency-key'];
    const memo = typeof key === 'string' && req.method === 'POST' ? `${path} ${key}` : null;
    const first = memo ? idempotent.get(memo) : undefined;
    if (first) return send(first.status, 'application/json', JSON.stringify(first.body), { 'idempotent-replayed': 'true' });
    let status = 200;
    let body;
    try {
      body = await api(req, form);
    } catch (e) {
      if (!(e instanceof ApiError)) throw e;
      status = e.status;
      body = e.body;
    }
    if (memo) idempotent.set(memo, { status, body });
    send(status, 'application/json', JSON.stringify(body), { 'request-id': id('req') });
  })().catch((e) => {
    console.error('payments:', e);
    if (!res.headersSent) send(500, 'application/json', JSON.stringify({ error: { type: 'api_error', message: 'Stand-in failure.' } }));
  });
});
server.listen(port, '127.0.0.1', () =>
  console.log(
    `payments: stand-in on http://127.0.0.1:${port} (checkout pages at /pay/<session>; webhooks to ${startUrl || 'registered endpoints'})`,
  ),
);
const stop = () => server.close(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
