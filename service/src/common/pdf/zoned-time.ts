/**
 * Times on printed records: stored in UTC, printed in the works' own time zone with the zone's short name
 * (for example "14 Aug 2026 09:30 BST"), so a reader never has to guess which clock a time belongs to.
 */
export interface ZonedClock {
  /** The IANA name of the zone, e.g. Europe/London. */
  readonly zone: string;
  /** "14 Aug 2026 09:30 BST" */
  dateTime(at: Date | string | null | undefined): string;
  /** "14 Aug 2026" */
  date(at: Date | string | null | undefined): string;
  /** "09:30" (the zone's name is in the table heading or the footer) */
  time(at: Date | string | null | undefined): string;
  /** "2026-08-14", the local date for file names */
  isoDate(at: Date | string): string;
  /** "BST" */
  zoneName(at: Date | string): string;
}

const NONE = '\u2014';

/** True when the runtime knows the zone (an IANA name such as Europe/London). */
export function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

export function zonedClock(zone: string): ZonedClock {
  const fmt = new Intl.DateTimeFormat('en-GB', {
    timeZone: zone,
    year: 'numeric',
    month: 'short',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'short',
  });
  // British English names European zones (BST, CET), American English the American ones (CDT, EST);
  // where neither has a name the offset stays (GMT+10).
  const usName = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'short' });
  const partsOf = (at: Date | string) => {
    const p: Record<string, string> = {};
    for (const x of fmt.formatToParts(new Date(at))) p[x.type] = x.value;
    if (/^GMT[+-]/.test(p.timeZoneName ?? '')) {
      const us = usName.formatToParts(new Date(at)).find((x) => x.type === 'timeZoneName')?.value ?? '';
      if (us && !/^GMT[+-]/.test(us)) p.timeZoneName = us;
    }
    return p;
  };
  const monthNo = (m: string) =>
    String(['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'].indexOf(m.slice(0, 3)) + 1).padStart(
      2,
      '0',
    );
  return {
    zone,
    dateTime: (at) => {
      if (!at) return NONE;
      const p = partsOf(at);
      return `${p.day} ${p.month} ${p.year} ${p.hour}:${p.minute} ${p.timeZoneName}`;
    },
    date: (at) => {
      if (!at) return NONE;
      const p = partsOf(at);
      return `${p.day} ${p.month} ${p.year}`;
    },
    time: (at) => {
      if (!at) return NONE;
      const p = partsOf(at);
      return `${p.hour}:${p.minute}`;
    },
    isoDate: (at) => {
      const p = partsOf(at);
      return `${p.year}-${monthNo(p.month)}-${p.day}`;
    },
    zoneName: (at) => partsOf(at).timeZoneName,
  };
}
