import { agoText, countdown } from './countdown';

// Clock arithmetic only (common practice, no source: 60 s to the minute, 60 min to the hour).
describe('countdown', () => {
  const until = '2026-12-05T10:30:00.000Z';
  const at = (iso: string) => Date.parse(iso);
  it('shows minutes and seconds left', () => {
    expect(countdown(until, at('2026-12-05T10:17:55.000Z'))).toEqual({ remainingMs: 725_000, text: '12:05', expired: false });
  });
  it('rounds part of a second up, so it reads 0:00 only when the window has passed', () => {
    expect(countdown(until, at('2026-12-05T10:29:59.400Z')).text).toBe('0:01');
    expect(countdown(until, at('2026-12-05T10:30:00.000Z'))).toEqual({ remainingMs: 0, text: '0:00', expired: true });
    expect(countdown(until, at('2026-12-05T11:00:00.000Z')).expired).toBe(true);
  });
  it('shows hours when more than an hour is left', () => {
    expect(countdown(until, at('2026-12-05T09:27:55.000Z')).text).toBe('1:02:05');
  });
});

describe('agoText', () => {
  it('words how long ago', () => {
    const now = Date.parse('2026-12-05T12:00:00Z');
    expect(agoText('2026-12-05T11:59:30Z', now)).toBe('just now');
    expect(agoText('2026-12-05T11:17:00Z', now)).toBe('43 min ago');
    expect(agoText('2026-12-05T09:55:00Z', now)).toBe('2 h 05 min ago');
  });
});
