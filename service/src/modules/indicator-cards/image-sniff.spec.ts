import { encodePng } from '../../database/seeds/card-image.js';
import { sniffImage, MAX_IMAGE_SIDE_PX } from './image-sniff.js';

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

describe('recognising card images by their bytes', () => {
  it('a PNG of 7 × 3 pixels', () => {
    expect(sniffImage(encodePng(7, 3, new Uint8Array(7 * 3 * 3)))).toEqual({ contentType: 'image/png', widthPx: 7, heightPx: 3 });
  });
  it('a JPEG whose frame header says 640 × 480', () => {
    expect(sniffImage(jpegHeader(640, 480))).toEqual({ contentType: 'image/jpeg', widthPx: 640, heightPx: 480 });
  });
  it('an extended WebP of 1200 × 800', () => {
    expect(sniffImage(webpVp8x(1200, 800))).toEqual({ contentType: 'image/webp', widthPx: 1200, heightPx: 800 });
  });
  it('refuses text, an SVG, a PDF and a file that only starts like a PNG, whatever its name', () => {
    expect(sniffImage(Buffer.from('hello, not a card'))).toBeNull();
    expect(sniffImage(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><rect/></svg>'))).toBeNull();
    expect(sniffImage(Buffer.from('%PDF-1.7\n'))).toBeNull();
    expect(sniffImage(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))).toBeNull();
    expect(sniffImage(Buffer.from([0xff, 0xd8, 0xff, 0xd9]))).toBeNull();
  });
  it('refuses an image larger than any card photo needs', () => {
    expect(sniffImage(webpVp8x(MAX_IMAGE_SIDE_PX + 1, 100))).toBeNull();
  });
});
