// Benchmark 5: the UI in headless Chromium on loopback, served by the built service (the UI built by
// bench/run.sh into .data/bench/ui-dist). For the sign-in page and the live run page: every JavaScript
// file the page loads, its size as sent (the service does not compress) and gzipped (zlib level 6, what a
// compressing proxy would send). Time to a usable live run page: from navigation start until the board's
// tiles are visible, in a fresh browser context each time (cold cache), and again with the cache warm.
// Baseline: the same measurements of a blank HTML page with no script on the same server path.
import { gzipSync } from 'node:zlib';
import { performance } from 'node:perf_hooks';
import { chromium } from 'playwright-core';
import { BASE, context, api, log, round, stats, writeResult, PASSWORD } from './lib.mjs';

const ctx = context();
const RUNS = Number(process.env.B5_RUNS ?? 9);
const ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
const browser = await chromium.launch({ executablePath: process.env.CHROMIUM ?? '/usr/bin/chromium', headless: true, args: ARGS });

/** Records the scripts a page loads: url, bytes as sent, gzip bytes. */
function recordScripts(page) {
  const scripts = new Map();
  page.on('response', async (res) => {
    const req = res.request();
    if (req.resourceType() !== 'script' && !res.url().endsWith('.js')) return;
    try {
      const body = await res.body();
      scripts.set(res.url(), { url: res.url().replace(BASE, ''), bytes: body.length, gzipBytes: gzipSync(body, { level: 6 }).length });
    } catch {
      /* a redirect or an aborted load has no body */
    }
  });
  return scripts;
}
const total = (scripts) =>
  [...scripts.values()].reduce((a, s) => ({ bytes: a.bytes + s.bytes, gzipBytes: a.gzipBytes + s.gzipBytes }), { bytes: 0, gzipBytes: 0 });

const pair = await api('/api/auth/login', { method: 'POST', body: { email: ctx.people.operator, password: PASSWORD } });
const session = JSON.stringify({ accessToken: pair.accessToken, refreshToken: pair.refreshToken, user: pair.user });
// Two runs: one kept by hand (eight rounds of eleven points: the usual page), and the run of benchmark 1,
// which by now holds the thousands of live readings and alarm changes that benchmark sent.
const PAGES = {
  rounds: { path: `/runs/${ctx.runs.ui}`, tile: '[data-testid="board-T1"]' },
  busy: { path: `/runs/${ctx.runs.latency}`, tile: '[data-testid="board-L1"]' },
};

// ---- sign-in page: JavaScript loaded -------------------------------------------------------------------
let signIn;
{
  const c = await browser.newContext();
  const page = await c.newPage();
  const scripts = recordScripts(page);
  const t0 = performance.now();
  await page.goto(`${BASE}/sign-in`, { waitUntil: 'networkidle' });
  await page.getByRole('button', { name: 'Sign in' }).waitFor({ state: 'visible' });
  const usableMs = performance.now() - t0;
  signIn = { ...total(scripts), files: [...scripts.values()].sort((a, b) => b.gzipBytes - a.gzipBytes), usableMs: round(usableMs, 0) };
  await c.close();
}
log(
  `sign-in page: ${signIn.files.length} scripts, ${Math.round(signIn.bytes / 1024)} kB as sent, ` +
    `${Math.round(signIn.gzipBytes / 1024)} kB gzip`,
);

// ---- live run page: JavaScript loaded, time to usable -------------------------------------------------------
/**
 * A mid-range tablet on poor Wi-Fi: the CPU four times slower (Emulation.setCPUThrottlingRate) and a slow network
 * (Network.emulateNetworkConditions: 150 ms round trip, 1.6 Mbit/s down, 750 kbit/s up, the usual "slow 4G" figures).
 */
const TABLET = { cpuRate: 4, latencyMs: 150, downloadBytesPerS: (1.6 * 1024 * 1024) / 8, uploadBytesPerS: (750 * 1024) / 8 };
async function liveRunLoad({ warm, page: which = 'rounds', tablet = false }) {
  const { path: runPath, tile: firstTile } = PAGES[which];
  const c = await browser.newContext({ viewport: tablet ? { width: 1024, height: 768 } : { width: 1280, height: 900 } });
  await c.addInitScript((s) => localStorage.setItem('crankjournal.session', s), session);
  const page = await c.newPage();
  if (tablet) {
    const cdp = await c.newCDPSession(page);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: TABLET.cpuRate });
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', {
      offline: false,
      latency: TABLET.latencyMs,
      downloadThroughput: TABLET.downloadBytesPerS,
      uploadThroughput: TABLET.uploadBytesPerS,
    });
  }
  const errors = [];
  page.on('pageerror', (e) => errors.push(e.message));
  if (warm) {
    await page.goto(`${BASE}${runPath}`);
    await page.locator(firstTile).waitFor({ state: 'visible', timeout: 30_000 });
  }
  const scripts = recordScripts(page);
  const t0 = performance.now();
  await page.goto(`${BASE}${runPath}`);
  await page.locator(firstTile).waitFor({ state: 'visible', timeout: 60_000 });
  const usableMs = performance.now() - t0;
  const nav = await page.evaluate(() => {
    const n = performance.getEntriesByType('navigation')[0];
    return { domContentLoaded: n.domContentLoadedEventEnd, load: n.loadEventEnd };
  });
  const tiles = await page.locator('[data-testid^="board-"]').count();
  await page.waitForLoadState('networkidle');
  const out = { usableMs, scripts: total(scripts), files: [...scripts.values()], tiles, errors, nav };
  await c.close();
  return out;
}

const cold = [];
const warm = [];
const busy = [];
for (let i = 0; i < RUNS; i++) cold.push(await liveRunLoad({ warm: false }));
for (let i = 0; i < RUNS; i++) warm.push(await liveRunLoad({ warm: true }));
for (let i = 0; i < Math.ceil(RUNS / 3); i++) busy.push(await liveRunLoad({ warm: false, page: 'busy' }));
const tablet = [];
for (let i = 0; i < Math.ceil(RUNS / 3); i++) tablet.push(await liveRunLoad({ warm: false, tablet: true }));
const tabletStats = stats(tablet.map((x) => x.usableMs));
log(`live run page as a tablet on poor Wi-Fi (CPU ÷4, slow network): usable after ${Math.round(tabletStats.median)} ms (cold, median)`);
const coldStats = stats(cold.map((x) => x.usableMs));
const warmStats = stats(warm.map((x) => x.usableMs));
const busyStats = stats(busy.map((x) => x.usableMs));
const counts = async (runId) => (await api(`/api/runs/${runId}/readings`, { token: pair.accessToken })).length;
const readingsIn = { rounds: await counts(ctx.runs.ui), busy: await counts(ctx.runs.latency) };
log(`busy run (${readingsIn.busy} readings): usable after ${Math.round(busyStats.median)} ms (cold, median)`);
const live = cold[cold.length - 1];
log(
  `live run page: ${live.files.length} scripts, ${Math.round(live.scripts.bytes / 1024)} kB as sent, ` +
    `${Math.round(live.scripts.gzipBytes / 1024)} kB gzip; usable after ${Math.round(coldStats.median)} ms (cold, ` +
    `median), ${Math.round(warmStats.median)} ms (warm)`,
);
if (live.errors.length) log(`page errors: ${live.errors.slice(0, 3).join(' | ')}`);

// ---- baseline: a page with no script, same server (the service answers unknown paths with index.html,
// so the baseline is the bare HTML document of the sign-in route with scripts blocked) ------------------------
const bare = [];
for (let i = 0; i < RUNS; i++) {
  const c = await browser.newContext();
  await c.route('**/*.js', (r) => r.abort());
  const page = await c.newPage();
  const t0 = performance.now();
  await page.goto(`${BASE}/sign-in`, { waitUntil: 'load' });
  bare.push(performance.now() - t0);
  await c.close();
}
const bareStats = stats(bare);
await browser.close();

const r = (s) => ({ n: s.n, median: round(s.median, 0), p99: round(s.p99, 0), max: round(s.max, 0) });
writeResult('b5', {
  title: 'UI',
  design: { runs: RUNS, viewport: '1280x900', gzipLevel: 6 },
  signIn: { bytes: signIn.bytes, gzipBytes: signIn.gzipBytes, files: signIn.files, usableMs: signIn.usableMs },
  liveRun: {
    bytes: live.scripts.bytes,
    gzipBytes: live.scripts.gzipBytes,
    files: live.files.sort((a, b) => b.gzipBytes - a.gzipBytes),
    tiles: live.tiles,
    errors: live.errors,
    usableMsCold: r(coldStats),
    usableMsWarm: r(warmStats),
    readings: readingsIn.rounds,
    busy: { readings: readingsIn.busy, usableMsCold: r(busyStats) },
    tablet: { profile: TABLET, usableMsCold: r(tabletStats) },
  },
  baseline: { bareDocumentMs: r(bareStats) },
  ratio: { coldToBare: round(coldStats.median / bareStats.median, 1) },
  target: { signInGzipKb: 250, usableMs: 1000, tabletUsableMs: 3000 },
  met: { signIn: signIn.gzipBytes <= 250 * 1024, usable: coldStats.p99 <= 1000, tablet: tabletStats.p99 <= 3000 },
});
process.exit(0);
