// Draws the installable app's icons (public/icons/*.png) from our mark, in Debian's Chromium.
// Run after changing the mark: node ops/draw-icons.mjs. The PNGs are committed.
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

const here = dirname(fileURLToPath(import.meta.url));
const out = join(here, '..', 'ui', 'public', 'icons');

/** The mark of Brand.tsx: a crank wheel and its brass arm on copper. `inset` leaves the safe zone of a maskable icon. */
function mark(inset, rounded) {
  const s = 64 - 2 * inset;
  const k = s / 64;
  const g = (x, y) => `${(inset + x * k).toFixed(2)} ${(inset + y * k).toFixed(2)}`;
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 64 64">
  <rect width="64" height="64" rx="${rounded ? 12 : 0}" fill="#2f6b5e"/>
  <circle cx="${inset + 24 * k}" cy="${inset + 32 * k}" r="${14 * k}" fill="none" stroke="#e9dcb5" stroke-width="${5 * k}"/>
  <circle cx="${inset + 24 * k}" cy="${inset + 32 * k}" r="${3 * k}" fill="#e9dcb5"/>
  <path d="M${g(24, 32)} L${g(52, 22)}" stroke="#c9a24a" stroke-width="${5 * k}" stroke-linecap="round"/>
</svg>`;
}

const icons = [
  { file: 'icon-192.png', size: 192, svg: mark(0, true) },
  { file: 'icon-512.png', size: 512, svg: mark(0, true) },
  { file: 'maskable-512.png', size: 512, svg: mark(10, false) },
  { file: 'apple-touch-icon-180.png', size: 180, svg: mark(4, false) },
];

mkdirSync(out, { recursive: true });
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu'] });
try {
  const page = await browser.newPage();
  for (const i of icons) {
    await page.setViewportSize({ width: i.size, height: i.size });
    const svg = i.svg.replace('<svg ', `<svg width="${i.size}" height="${i.size}" `);
    await page.setContent(`<html><body style="margin:0;background:transparent">${svg}</body></html>`);
    writeFileSync(join(out, i.file), await page.screenshot({ omitBackground: true, clip: { x: 0, y: 0, width: i.size, height: i.size } }));
    console.log(`wrote ui/public/icons/${i.file}`);
  }
} finally {
  await browser.close();
}
