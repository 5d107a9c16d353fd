import { csvCell, csvLine } from './csv.util.js';

describe('CSV cells (OWASP CSV injection guidance: prefix formula-leading cells)', () => {
  it.each(['=1+1', '+44', '-2+3', '@SUM(A1)', '\tx', '\rx'])('neutralises %j', (v) => {
    const c = csvCell(v);
    expect(c.replace(/^"/, '').startsWith("'")).toBe(true);
  });
  it('keeps plain text and numbers as they are, negative numbers included', () => {
    expect(csvCell('Main bearing')).toBe('Main bearing');
    expect(csvCell(-12.5)).toBe('-12.5');
    expect(csvCell(NaN)).toBe('');
  });
  it('quotes commas and quotes', () => {
    expect(csvLine(['a,b', 'say "hi"'])).toBe('"a,b","say ""hi"""\r\n');
  });
});
