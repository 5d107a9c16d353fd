import { readFileSync } from 'node:fs';
import { extname, join } from 'node:path';
import { gzipSync } from 'node:zlib';
import type express from 'express';

/** Content types of the files a UI build puts under assets/. */
const TYPES: Record<string, string> = {
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.woff2': 'font/woff2',
  '.woff': 'font/woff',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.webp': 'image/webp',
};
/** Kinds worth compressing (fonts and images are compressed already). */
const COMPRESS = new Set(['.js', '.css', '.svg']);

interface Asset {
  type: string;
  body: Buffer;
  gzip: Buffer | null;
}

/**
 * The UI build's hashed files (`/assets/<name>-<hash>.<ext>`: a name never changes content) served from memory, each
 * read and gzipped once, instead of a file-system look-up, a read and a fresh compression for every request (a live
 * run page asks for some seventy of them). Anything else, or a name not in the folder, goes on to the next handler.
 */
export function uiAssets(uiDist: string): express.RequestHandler {
  const dir = join(uiDist, 'assets');
  const cache = new Map<string, Asset>();
  const load = (name: string): Asset | null => {
    const type = TYPES[extname(name)];
    if (!type) return null;
    try {
      const body = readFileSync(join(dir, name));
      const gzip = COMPRESS.has(extname(name)) && body.length >= 1024 ? gzipSync(body, { level: 9 }) : null;
      return { type, body, gzip };
    } catch {
      return null;
    }
  };
  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    const m = /^\/assets\/([\w.-]+)$/.exec(req.path);
    if (!m || m[1].startsWith('.')) return next();
    const name = m[1];
    let asset = cache.get(name) ?? null;
    if (!asset) {
      asset = load(name);
      // A name not found is not remembered (a new build may add it); found ones are kept for the life of the process.
      if (asset) cache.set(name, asset);
    }
    if (!asset) return next();
    const gzip = asset.gzip && /\bgzip\b/.test(String(req.headers['accept-encoding'] ?? ''));
    const body = gzip ? asset.gzip! : asset.body;
    res.setHeader('Content-Type', asset.type);
    res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
    if (asset.gzip) res.setHeader('Vary', 'Accept-Encoding');
    if (gzip) res.setHeader('Content-Encoding', 'gzip');
    res.setHeader('Content-Length', String(body.length));
    res.status(200);
    if (req.method === 'HEAD') res.end();
    else res.end(body);
  };
}
