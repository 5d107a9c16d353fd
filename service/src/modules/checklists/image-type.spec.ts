import { sniffImageType } from './image-type.js';

const bytes = (...xs: (number | string)[]) =>
  Uint8Array.from(xs.flatMap((x) => (typeof x === 'string' ? [...x].map((c) => c.charCodeAt(0)) : [x])));

describe('sniffImageType', () => {
  it('recognises PNG by its 8-byte signature (PNG specification, W3C / ISO/IEC 15948:2003, section 5.2 "PNG signature"; section from memory)', () => {
    expect(sniffImageType(bytes(0x89, 'PNG', 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13))).toBe('image/png');
    expect(sniffImageType(bytes(0x89, 'PNG', 0x0d, 0x0a, 0x1a))).toBeNull();
  });
  it('recognises JPEG by its SOI marker FF D8 followed by another marker (ITU-T T.81 / ISO/IEC 10918-1, Annex B, Table B.1 "Marker code assignments"; from memory)', () => {
    expect(sniffImageType(bytes(0xff, 0xd8, 0xff, 0xe0, 0, 16, 'JFIF'))).toBe('image/jpeg');
    expect(sniffImageType(bytes(0xff, 0xd8, 0x00))).toBeNull();
  });
  it('recognises WebP by its RIFF header with form type "WEBP" (IETF RFC 9649 "WebP Image Format", 2024, the container’s "RIFF Header"; section from memory)', () => {
    expect(sniffImageType(bytes('RIFF', 0x24, 0, 0, 0, 'WEBP', 'VP8 '))).toBe('image/webp');
    expect(sniffImageType(bytes('RIFF', 0x24, 0, 0, 0, 'WAVE', 'fmt '))).toBeNull();
  });
  it('refuses anything else, whatever it is called: a GIF, an SVG, a PDF, text, nothing', () => {
    expect(sniffImageType(bytes('GIF89a', 1, 0, 1, 0))).toBeNull();
    expect(sniffImageType(bytes('<svg xmlns="http://www.w3.org/2000/svg">'))).toBeNull();
    expect(sniffImageType(bytes('%PDF-1.7'))).toBeNull();
    expect(sniffImageType(new Uint8Array(0))).toBeNull();
  });
});
