import { encodePng } from '../../database/seeds/card-image.js';
import { MAX_IMAGE_SIDE_PX, sniffImage, sniffImageType } from './image-sniff.js';

const bytes = (...xs: (number | string)[]) =>
  Uint8Array.from(xs.flatMap((x) => (typeof x === 'string' ? [...x].map((c) => c.charCodeAt(0)) : [x])));

// Signatures and headers from the formats' own specifications: PNG (W3C, Portable Network Graphics
// Specification, 2nd ed., sections 5.2 signature and 11.2.2 IHDR); JPEG (ITU-T T.81, Annex B: SOI FFD8,
// SOF0 FFC0 with height then width); WebP (Google, WebP Container Specification: RIFF…WEBP, VP8X chunk
// with 24-bit canvas width − 1 and height − 1).

function jpegHeader(width: number, height: number): Buffer {
  const app0 = Buffer.from([0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00]);
  const sof0 = Buffer.from([
    0xff,
    0xc0,
    0x00,
    0x11,
    0x08,
    height >> 8,
    height & 0xff,
    width >> 8,
    width & 0xff,
    0x03,
    1,
    0x22,
    0,
    2,
    0x11,
    1,
    3,
    0x11,
    1,
  ]);
  return Buffer.concat([Buffer.from([0xff, 0xd8]), app0, sof0, Buffer.from([0xff, 0xd9])]);
}
function webpVp8x(width: number, height: number): Buffer {
  const b = Buffer.alloc(30);
  b.write('RIFF', 0, 'latin1');
  b.writeUInt32LE(22, 4);
  b.write('WEBP', 8, 'latin1');
  b.write('VP8X', 12, 'latin1');
  b.writeUInt32LE(10, 16);
  b.writeUIntLE(width - 1, 24, 3);
  b.writeUIntLE(height - 1, 27, 3);
  return b;
}

describe('sniffImageType', () => {
  // PNG specification, W3C / ISO/IEC 15948:2003, section 5.2 "PNG signature"; section from memory.
  it('recognises PNG by its 8-byte signature', async () => {
    expect(await sniffImageType(bytes(0x89, 'PNG', 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 'IHDR'))).toBe('image/png');
    expect(await sniffImageType(bytes(0x89, 'PNG', 0x0d, 0x0a, 0x1a))).toBeNull();
  });
  // ITU-T T.81 / ISO/IEC 10918-1, Annex B, Table B.1 "Marker code assignments"; from memory.
  it('recognises JPEG by its SOI marker FF D8 followed by another marker', async () => {
    expect(await sniffImageType(bytes(0xff, 0xd8, 0xff, 0xe0, 0, 16, 'JFIF'))).toBe('image/jpeg');
    expect(await sniffImageType(bytes(0xff, 0xd8, 0x00))).toBeNull();
  });
  // IETF RFC 9649 "WebP Image Format", 2024, the container’s "RIFF Header"; section from memory.
  it('recognises WebP by its RIFF header with form type "WEBP"', async () => {
    expect(await sniffImageType(bytes('RIFF', 0x24, 0, 0, 0, 'WEBP', 'VP8 '))).toBe('image/webp');
    expect(await sniffImageType(bytes('RIFF', 0x24, 0, 0, 0, 'WAVE', 'fmt '))).toBeNull();
  });
  it('refuses anything else, whatever it is called: a GIF, an SVG, a PDF, text, nothing', async () => {
    expect(await sniffImageType(bytes('GIF89a', 1, 0, 1, 0))).toBeNull();
    expect(await sniffImageType(bytes('<svg xmlns="http://www.w3.org/2000/svg">'))).toBeNull();
    expect(await sniffImageType(bytes('%PDF-1.7'))).toBeNull();
    expect(await sniffImageType(new Uint8Array(0))).toBeNull();
  });
});

describe('recognising card images by their bytes', () => {
  it('a PNG of 7 × 3 pixels', async () => {
    expect(await sniffImage(encodePng(7, 3, new Uint8Array(7 * 3 * 3)))).toEqual({ contentType: 'image/png', widthPx: 7, heightPx: 3 });
  });
  it('a JPEG whose frame header says 640 × 480', async () => {
    expect(await sniffImage(jpegHeader(640, 480))).toEqual({ contentType: 'image/jpeg', widthPx: 640, heightPx: 480 });
  });
  it('an extended WebP of 1200 × 800', async () => {
    expect(await sniffImage(webpVp8x(1200, 800))).toEqual({ contentType: 'image/webp', widthPx: 1200, heightPx: 800 });
  });
  it('refuses text, an SVG, a PDF and a file that only starts like a PNG, whatever its name', async () => {
    expect(await sniffImage(Buffer.from('hello, not a card'))).toBeNull();
    expect(await sniffImage(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><rect/></svg>'))).toBeNull();
    expect(await sniffImage(Buffer.from('%PDF-1.7\n'))).toBeNull();
    expect(await sniffImage(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))).toBeNull();
    expect(await sniffImage(Buffer.from([0xff, 0xd8, 0xff, 0xd9]))).toBeNull();
  });
  it('refuses an image larger than any card photo needs', async () => {
    expect(await sniffImage(webpVp8x(MAX_IMAGE_SIDE_PX + 1, 100))).toBeNull();
  });
});
