import type { CardImageType } from '@crankjournal/shared-types';

/** What the bytes of an image say it is, whatever its name or declared type. */
export interface SniffedImage {
  contentType: CardImageType;
  widthPx: number;
  heightPx: number;
}

/** Larger images are refused: a card photo needs no more, and the browser has to draw it. */
export const MAX_IMAGE_SIDE_PX = 12_000;

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

function startsWith(buf: Buffer, bytes: number[], at = 0): boolean {
  return buf.length >= at + bytes.length && bytes.every((b, i) => buf[at + i] === b);
}
const ascii = (buf: Buffer, at: number, length: number) => (buf.length >= at + length ? buf.toString('latin1', at, at + length) : '');

function png(buf: Buffer): SniffedImage | null {
  if (!startsWith(buf, PNG_SIGNATURE) || ascii(buf, 12, 4) !== 'IHDR' || buf.length < 24) return null;
  return { contentType: 'image/png', widthPx: buf.readUInt32BE(16), heightPx: buf.readUInt32BE(20) };
}

function jpeg(buf: Buffer): SniffedImage | null {
  if (!startsWith(buf, [0xff, 0xd8, 0xff])) return null;
  let i = 2;
  while (i + 3 < buf.length) {
    if (buf[i] !== 0xff) return null;
    const marker = buf[i + 1];
    if (marker === 0xff) {
      i++; // fill byte
      continue;
    }
    if (marker === 0xd8 || marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) {
      i += 2; // markers without a length
      continue;
    }
    if (marker === 0xd9 || marker === 0xda) return null; // end of image or start of scan before a frame header
    const length = buf.readUInt16BE(i + 2);
    // Start-of-frame markers C0–CF, except DHT (C4), JPG (C8) and DAC (CC).
    if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
      if (i + 9 > buf.length) return null;
      return { contentType: 'image/jpeg', heightPx: buf.readUInt16BE(i + 5), widthPx: buf.readUInt16BE(i + 7) };
    }
    i += 2 + length;
  }
  return null;
}

function webp(buf: Buffer): SniffedImage | null {
  if (ascii(buf, 0, 4) !== 'RIFF' || ascii(buf, 8, 4) !== 'WEBP') return null;
  const chunk = ascii(buf, 12, 4);
  if (chunk === 'VP8 ' && buf.length >= 30 && startsWith(buf, [0x9d, 0x01, 0x2a], 23)) {
    return { contentType: 'image/webp', widthPx: buf.readUInt16LE(26) & 0x3fff, heightPx: buf.readUInt16LE(28) & 0x3fff };
  }
  if (chunk === 'VP8L' && buf.length >= 25 && buf[20] === 0x2f) {
    const bits = buf.readUInt32LE(21);
    return { contentType: 'image/webp', widthPx: (bits & 0x3fff) + 1, heightPx: ((bits >> 14) & 0x3fff) + 1 };
  }
  if (chunk === 'VP8X' && buf.length >= 30) {
    return { contentType: 'image/webp', widthPx: buf.readUIntLE(24, 3) + 1, heightPx: buf.readUIntLE(27, 3) + 1 };
  }
  return null;
}

/**
 * Recognises a PNG, JPEG or WebP image by its bytes (signature and header) and reads its size;
 * null for anything else, including an image whose header cannot be read or whose size is absurd.
 */
export function sniffImage(buf: Buffer): SniffedImage | null {
  const found = png(buf) ?? jpeg(buf) ?? webp(buf);
  if (!found) return null;
  const ok = (n: number) => Number.isInteger(n) && n > 0 && n <= MAX_IMAGE_SIDE_PX;
  return ok(found.widthPx) && ok(found.heightPx) ? found : null;
}
