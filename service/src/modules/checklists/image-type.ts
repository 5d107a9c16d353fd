/** The image types a checklist photo may be, recognised by their first bytes (never by name or declared type). */
export type ImageType = 'image/png' | 'image/jpeg' | 'image/webp';

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** PNG (8-byte signature), JPEG (SOI marker FF D8 then a marker FF), WebP (RIFF container of form type "WEBP"); otherwise null. */
export function sniffImageType(b: Uint8Array): ImageType | null {
  if (b.length >= 8 && PNG_SIGNATURE.every((x, i) => b[i] === x)) return 'image/png';
  if (b.length >= 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) return 'image/jpeg';
  const ascii = (from: number, to: number) => String.fromCharCode(...b.subarray(from, to));
  if (b.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'image/webp';
  return null;
}

export const IMAGE_EXTENSIONS: Record<ImageType, string> = { 'image/png': 'png', 'image/jpeg': 'jpg', 'image/webp': 'webp' };
