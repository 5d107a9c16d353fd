import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import pixelmatch from 'pixelmatch';
import { PNG } from 'pngjs';

/**
 * Checks on a printed record with poppler-utils (pdffonts, pdftotext -bbox, pdftoppm), which ops/lib.sh
 * installs when missing: every font embedded, no word's box over another's, no replacement characters,
 * the page count and the "page N of M" footers right, and one page compared with a committed golden image.
 */
export interface PdfWord {
  page: number;
  text: string;
  xMin: number;
  yMin: number;
  xMax: number;
  yMax: number;
}

export interface PdfInspection {
  pages: number;
  fonts: { name: string; embedded: boolean }[];
  words: PdfWord[];
  text: string;
  info: Record<string, string>;
}

function withFile<T>(pdf: Buffer, fn: (file: string, dir: string) => T): T {
  const dir = mkdtempSync(join(tmpdir(), 'cj-pdf-'));
  try {
    const file = join(dir, 'record.pdf');
    writeFileSync(file, pdf);
    return fn(file, dir);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const decode = (s: string) =>
  s
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&amp;/g, '&');

export function inspectPdf(pdf: Buffer): PdfInspection {
  return withFile(pdf, (file) => {
    const fontsOut = execFileSync('pdffonts', [file], { encoding: 'utf8' });
    const fonts = fontsOut
      .split('\n')
      .slice(2)
      .filter((l) => l.trim())
      .map((l) => {
        const cols = l.trim().split(/\s+/);
        // name type... emb sub uni object ID: emb is the 5th column from the end
        return { name: cols[0], embedded: cols[cols.length - 5] === 'yes' };
      });
    const infoOut = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
    const info: Record<string, string> = {};
    for (const l of infoOut.split('\n')) {
      const m = /^([^:]+):\s*(.*)$/.exec(l);
      if (m) info[m[1].trim()] = m[2].trim();
    }
    const html = execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    const words: PdfWord[] = [];
    let page = 0;
    for (const l of html.split('\n')) {
      if (l.includes('<page ')) page++;
      const m = /<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">(.*)<\/word>/.exec(l);
      if (m) words.push({ page, xMin: +m[1], yMin: +m[2], xMax: +m[3], yMax: +m[4], text: decode(m[5]) });
    }
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    return { pages: Number(info.Pages), fonts, words, text, info };
  });
}

/** Pairs of words on the same page whose boxes overlap by more than a sliver (0.5 pt each way). */
export function overlappingWords(words: PdfWord[]): [PdfWord, PdfWord][] {
  const out: [PdfWord, PdfWord][] = [];
  const byPage = new Map<number, PdfWord[]>();
  for (const w of words) byPage.set(w.page, [...(byPage.get(w.page) ?? []), w]);
  for (const list of byPage.values()) {
    const sorted = [...list].sort((a, b) => a.yMin - b.yMin);
    for (let i = 0; i < sorted.length; i++) {
      const a = sorted[i];
      for (let j = i + 1; j < sorted.length && sorted[j].yMin < a.yMax; j++) {
        const b = sorted[j];
        const ox = Math.min(a.xMax, b.xMax) - Math.max(a.xMin, b.xMin);
        const oy = Math.min(a.yMax, b.yMax) - Math.max(a.yMin, b.yMin);
        if (ox > 0.5 && oy > 0.5) out.push([a, b]);
      }
    }
  }
  return out;
}

/** Words with a replacement character, a private-use code, a control character or a "?" standing for a glyph. */
export function mangledWords(words: PdfWord[]): PdfWord[] {
  // eslint-disable-next-line no-control-regex
  return words.filter((w) => /[\ufffd\ue000-\uf8ff\u0000-\u0008]|\?{1}/.test(w.text));
}

/** The "page N of M" footers found, one per page, in order. */
export function pageFooters(text: string): string[] {
  return [...text.matchAll(/page (\d+) of (\d+)/g)].map((m) => m[0]);
}

/**
 * Renders one page at 50 dpi and compares it with the golden image beside the test (pixelmatch, threshold 0.1);
 * returns the share of pixels that differ. With UPDATE_GOLDENS=1 it writes the golden instead.
 */
export function compareWithGolden(pdf: Buffer, page: number, goldenPath: string): number {
  const png = withFile(pdf, (file, dir) => {
    execFileSync('pdftoppm', ['-png', '-r', '50', '-f', String(page), '-l', String(page), '-singlefile', file, join(dir, 'page')]);
    return readFileSync(join(dir, 'page.png'));
  });
  if (process.env.UPDATE_GOLDENS === '1' || !existsSync(goldenPath)) {
    if (process.env.UPDATE_GOLDENS !== '1') throw new Error(`no golden image at ${goldenPath}: run with UPDATE_GOLDENS=1 once`);
    mkdirSync(dirname(goldenPath), { recursive: true });
    writeFileSync(goldenPath, png);
    return 0;
  }
  const a = PNG.sync.read(png);
  const b = PNG.sync.read(readFileSync(goldenPath));
  if (a.width !== b.width || a.height !== b.height) return 1;
  const diff = pixelmatch(a.data, b.data, undefined, a.width, a.height, { threshold: 0.1 });
  return diff / (a.width * a.height);
}
