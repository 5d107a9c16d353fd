import { mkdtempSync, mkdirSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import express from 'express';
import request from 'supertest';
import { uiAssets } from './ui-assets.js';

// HTTP content coding and caching as in RFC 9110 §8.4 (Content-Encoding), §12.5.5 (Vary) and RFC 9111 §5.2.2
// (Cache-Control); `immutable` from RFC 8246.
describe('UI build assets served from memory', () => {
  const dist = mkdtempSync(join(tmpdir(), 'cj-ui-'));
  const script = `export const x = ${JSON.stringify('a'.repeat(4000))};\n`;
  mkdirSync(join(dist, 'assets'));
  writeFileSync(join(dist, 'assets', 'page-AbC123.js'), script);
  writeFileSync(join(dist, 'assets', 'tiny-AbC123.css'), 'a{}');
  const app = express();
  app.use(uiAssets(dist));
  app.use((_req, res) => res.status(404).send('next handler'));
  afterAll(() => rmSync(dist, { recursive: true, force: true }));

  it('sends a hashed script gzipped to a client that accepts gzip, with its type and a year-long immutable cache', async () => {
    const res = await request(app).get('/assets/page-AbC123.js').set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['content-type']).toBe('text/javascript; charset=utf-8');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['vary']).toBe('Accept-Encoding');
    // The bytes sent are the gzipped file (the test client decodes them again).
    expect(Number(res.headers['content-length'])).toBe(gzipSync(script, { level: 9 }).length);
    expect(Number(res.headers['content-length'])).toBeLessThan(script.length / 10);
    expect(res.text).toBe(script);
  });

  it('sends the same file plain to a client that does not accept gzip, and a small file always plain', async () => {
    const plain = await request(app).get('/assets/page-AbC123.js').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.text).toBe(script);
    const tiny = await request(app).get('/assets/tiny-AbC123.css').set('Accept-Encoding', 'gzip');
    expect(tiny.headers['content-encoding']).toBeUndefined();
    expect(tiny.text).toBe('a{}');
  });

  it('leaves unknown names, paths outside assets/, other methods and climbing paths to the next handler', async () => {
    expect((await request(app).get('/assets/missing.js')).text).toBe('next handler');
    expect((await request(app).get('/index.html')).text).toBe('next handler');
    expect((await request(app).post('/assets/page-AbC123.js')).text).toBe('next handler');
    expect((await request(app).get('/assets/..%2Fsecret.js')).text).toBe('next handler');
    expect((await request(app).get('/assets/.hidden.js')).text).toBe('next handler');
  });
});
