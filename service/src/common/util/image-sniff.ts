import { fileTypeFromBuffer } from 'file-type';

/**
 * Photos people upload (checklist evidence, indicator card images) are recognised by their bytes, never by their
 * name or declared type: the `file-type` package reads the signature, and the image's own header gives its size.
 */
export type ImageType = 'image/png' | 'image/jpeg' | 'image/webp';

const IMAGE_TYPES: readonly string[] = ['image/png', 'image/jpeg', 'image/webp'] satisfies ImageType[];

export const IMAGE_EXTENSIONS: Record<ImageType, string> = { 'image/png': 'png', 'image/jpeg': 'jpg', 'image/webp': 'webp' };

/** What the bytes of an image say it is, and its size. */
export interface SniffedImage {
  contentType: ImageType;
  widthPx: number;
  heightPx: number;
}

/** Larger images are refused: a card photo needs no more, and the browser has to draw it. */
export const MAX_IMAGE_SIDE_PX = 12_000;

/** PNG, JPEG or WebP by the file's signature; null for anything else (GIF, SVG, PDF, text, nothing). */
export async function sniffImageType(bytes: Uint8Array): Promise<ImageType | null> {
  if (bytes.length === 0) return null;
  const found = await fileTypeFromBuffer(bytes);
  return found && IMAGE_TYPES.includes(found.mime) ? (found.mime as ImageType) : null;
}

const ascii = (buf: Buffer, at: number, length: number) => (buf.length >= at + length ? buf.toString('latin1', at, at + length) : '');

/** PNG: the IHDR chunk right after the signature holds width and height. */
function pngSize(buf: Buffer): [number, number] | null {
  if (ascii(buf, 12, 4) !== 'IHDR' || buf.length < 24) return null;
  return [buf.readUInt32BE(16), buf.readUInt32BE(20)];
}

/** JPEG: walk the markers to the first start-of-frame, which holds height then width. */
function jpegSize(buf: Buffer): [number, number] | null {
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
      return [buf.readUInt16BE(i + 7), buf.readUInt16BE(i + 5)];
    }
    i += 2 + length;
  }
  return null;
}

/** WebP: the first chunk (lossy VP8, lossless VP8L or extended VP8X) holds the size. */
function webpSize(buf: Buffer): [number, number] | null {
  const chunk = ascii(buf, 12, 4);
  if (chunk === 'VP8 ' && buf.length >= 30 && buf[23] === 0x9d && buf[24] === 0x01 && buf[25] === 0x2a) {
    return [buf.readUInt16LE(26) & 0x3fff, buf.readUInt16LE(28) & 0x3fff];
  }
  if (chunk === 'VP8L' && buf.length >= 25 && buf[20] === 0x2f) {
    const bits = buf.readUInt32LE(21);
    return [(bits & 0x3fff) + 1, ((bits >> 14) & 0x3fff) + 1];
  }
  if (chunk === 'VP8X' && buf.length >= 30) return [buf.readUIntLE(24, 3) + 1, buf.readUIntLE(27, 3) + 1];
  return null;
}

const SIZE_READERS: Record<ImageType, (buf: Buffer) => [number, number] | null> = {
  'image/png': pngSize,
  'image/jpeg': jpegSize,
  'image/webp': webpSize,
};

/**
 * A PNG, JPEG or WebP image and its size; null for anything else, including an image whose header cannot be
 * read or whose size is absurd.
 */
export async function sniffImage(buf: Buffer): Promise<SniffedImage | null> {
  const contentType = await sniffImageType(buf);
  if (!contentType) return null;
  const size = SIZE_READERS[contentType](buf);
  if (!size) return null;
  const [widthPx, heightPx] = size;
  const ok = (n: number) => Number.isInteger(n) && n > 0 && n <= MAX_IMAGE_SIDE_PX;
  return ok(widthPx) && ok(heightPx) ? { contentType, widthPx, heightPx } : null;
}
