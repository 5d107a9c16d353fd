/**
 * POST /api/calculations/indicator-autotrace: a card photo in, the proposed trace and its mean
 * effective pressure out. The expected figures come from the same pure functions (autotraceCard),
 * and the drawn outline's own MEP (common practice, no source: net area over length × spring).
 */
import { PNG } from 'pngjs';
import { drawIndicatorCard } from '../src/database/seeds/card-image.js';
import { sniffImage } from '../src/common/util/image-sniff.js';
import { drawTestCard, outlineMepPsi, testOutlines } from '../src/database/seeds/autotrace-cards.js';
import { readCardSamples, sampleCards } from '../src/database/seeds/indicator-card-samples.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { requestAs } from './utils/signed-in.js';

describe('POST /api/calculations/indicator-autotrace', () => {
  let t: TestApp;
  let observer: SignedIn;
  const samples = readCardSamples();
  const card = sampleCards(
    samples,
    samples.sets.find((s) => s.method === 'trace')!,
  )[0];
  const drawn = drawIndicatorCard(card.drawing);
  const url = `/api/calculations/indicator-autotrace?lengthIn=${card.lengthIn}&springPsiPerIn=${card.springPsiPerIn}`;

  beforeAll(async () => {
    t = await startTestApp();
    observer = await login(t, 'observer');
  }, 180_000);
  afterAll(async () => {
    await t?.close();
  });

  it('traces a demo card photo (PNG) for any signed-in role, within 1.5 % of the drawn MEP from the card length alone', async () => {
    const res = await requestAs(t, observer).post(url).set('content-type', 'image/png').send(drawn.png);
    expect(res.status).toBe(200);
    expect(res.body.trace.pointsPx.length).toBeGreaterThan(10);
    expect(res.body.trace.atmosphericLine).toHaveLength(2);
    expect(res.body.areaIn2).toBeGreaterThan(0);
    expect(res.body.confidence).toBeGreaterThan(0.5);
    expect(Array.isArray(res.body.warnings)).toBe(true);
    expect(Math.abs(res.body.meanEffectivePressurePsi / outlineMepPsi(drawn.outline) - 1)).toBeLessThan(0.015);
    // MEP = area / length × spring, the card's own figures.
    expect(res.body.meanEffectivePressurePsi).toBeCloseTo((res.body.areaIn2 / card.lengthIn) * card.springPsiPerIn, 6);
  });

  it('reads a JPEG photo judged by its bytes, whatever the declared type', async () => {
    const o = testOutlines()[1];
    const photo = drawTestCard({
      name: 'e2e jpeg',
      outlines: [o.outline],
      springPsiPerIn: o.springPsiPerIn,
      lengthIn: 3.5,
      tiltDeg: 5,
      unevenLight: 0.3,
      shadow: true,
      noise: 4,
      blurPx: 1,
      jpegQuality: 70,
    });
    const res = await requestAs(t, observer)
      .post(`/api/calculations/indicator-autotrace?lengthIn=3.5&springPsiPerIn=${o.springPsiPerIn}`)
      .set('content-type', 'application/octet-stream')
      .send(photo.jpeg!);
    expect(res.status).toBe(200);
    expect(Math.abs(res.body.meanEffectivePressurePsi / photo.meanEffectivePressurePsi - 1)).toBeLessThan(0.015);
  });

  it('refuses without a session (401)', async () => {
    const res = await requestAs(t, undefined).post(url).set('content-type', 'image/png').send(drawn.png);
    expect(res.status).toBe(401);
  });

  it('answers 400 naming the field for a bad scale or a body that is not an image', async () => {
    const noLength = await requestAs(t, observer)
      .post('/api/calculations/indicator-autotrace?springPsiPerIn=60')
      .set('content-type', 'image/png')
      .send(drawn.png);
    expect(noLength.status).toBe(400);
    expect(JSON.stringify(noLength.body.message)).toContain('lengthIn');
    const badSpring = await requestAs(t, observer)
      .post('/api/calculations/indicator-autotrace?lengthIn=3.5&springPsiPerIn=-2')
      .set('content-type', 'image/png')
      .send(drawn.png);
    expect(badSpring.status).toBe(400);
    expect(JSON.stringify(badSpring.body.message)).toContain('springPsiPerIn');
    const notImage = await requestAs(t, observer).post(url).set('content-type', 'image/png').send(Buffer.from('not a picture at all'));
    expect(notImage.status).toBe(400);
    expect(notImage.body.message).toMatch(/^image:/);
  });

  it('answers 422 with the reasons when the photo holds no diagram', async () => {
    const blank = new PNG({ width: 400, height: 300 });
    blank.data.fill(210);
    const res = await requestAs(t, observer).post(url).set('content-type', 'image/png').send(PNG.sync.write(blank));
    expect(res.status).toBe(422);
    // The reasons, in words, are in the message (the one error shape of the API keeps statusCode, error, message).
    expect(res.body.message).toMatch(/^No single closed diagram was found: Too little contrast/);
  });

  it('answers 415 for a WebP photo (no decoder on the server)', async () => {
    // A minimal lossless WebP header: RIFF, WEBP, VP8L chunk with a 2 × 2 size.
    const webp = Buffer.from('524946461a000000574542505650384c0d0000002f0140000007100000000000000000', 'hex');
    expect((await sniffImage(webp))?.contentType).toBe('image/webp');
    const res = await requestAs(t, observer).post(url).set('content-type', 'image/webp').send(webp);
    expect(res.status).toBe(415);
    expect(res.body.message).toMatch(/WebP/);
  });
});
