import { zonedClock } from '../../common/pdf/zoned-time.js';
import { LOG_SHEET_SECTION, type LogSheetContext } from './run-log-sheet.sections.js';

// Wording of the card-set and close sections, from a hand-made context (no database).
const clock = zonedClock('America/Chicago');
const set = (complete: boolean, cards: { traceOrigin: string | null }[] = []) => ({
  cards,
  takenAt: '2026-08-08T15:00:00Z',
  speedRpm: 58.4,
  createdByName: 'Tobias Wrenfield',
  results: {
    complete,
    missingEnds: complete ? [] : [{ cylinderId: 'lp', cylinderLabel: 'LP', end: 'crank' }],
    cylinders: [{ label: 'HP', indicatedHorsepower: 121.04 }],
    totalIndicatedHorsepower: 121.04,
  },
});
const ctx = (over: Partial<Record<keyof LogSheetContext, unknown>>) => ({ clock, ...over }) as unknown as LogSheetContext;
const texts = (blocks: unknown) => JSON.stringify(blocks);

describe('the run log sheet sections', () => {
  it('a card set without a card for every end says "incomplete" and names the ends', () => {
    const out = texts(LOG_SHEET_SECTION.cardSets(ctx({ cardSets: [set(false), set(true)] })));
    expect(out).toContain('incomplete: no card for LP crank end');
    expect(out).toContain('complete: every end of every cylinder has a card');
    expect(out).toContain('121.0');
    // 15:00 UTC in August is 10:00 in Chicago (CDT)
    expect(out).toContain('08 Aug 2026 10:00 CDT');
  });

  it('a card set says how its traces were made, when its cards say', () => {
    const origins = [
      { traceOrigin: 'proposed-accepted' },
      { traceOrigin: 'proposed-accepted' },
      { traceOrigin: 'by-hand' },
      { traceOrigin: null },
    ];
    const out = texts(LOG_SHEET_SECTION.cardSets(ctx({ cardSets: [set(true, origins)] })));
    expect(out).toContain('complete: every end of every cylinder has a card; 2 traced automatically, accepted, 1 traced by hand');
    expect(texts(LOG_SHEET_SECTION.cardSets(ctx({ cardSets: [set(true, [{ traceOrigin: null }])] })))).toContain('has a card",');
  });

  it('a pre-alarm is printed as advisory with the forecast it was raised on', () => {
    const pre = {
      kind: 'pre_alarm',
      priority: 'advisory',
      pointLabel: 'Main bearing 2',
      message: 'Main bearing 2: high (130 °F) in about 3 min at the present trend',
      value: 125,
      limit: 130,
      unit: 'degF',
      raisedAt: '2026-08-08T15:00:00Z',
      acknowledgedAt: null,
      returnedAt: null,
      shelvedUntil: null,
      state: 'active_unacknowledged',
      suppression: null,
      forecast: { limitKind: 'high', minutesToLimit: 3.33, ratePerMin: 1.5 },
    };
    const out = texts(LOG_SHEET_SECTION.alarms(ctx({ alarms: [pre] })));
    expect(out).toContain('Pre-alarm (advisory), Limit forecast: Main bearing 2.');
    expect(out).toMatch(/Forecast: high in 3\.3\d* min at 1\.5\d* °F\/min\./);
    expect(out).toContain('"tone":"normal"');
  });

  it('the close shows the countersignature and the wet-signature block only when the works asks for one', () => {
    const run = { closedAt: '2026-08-08T20:00:00Z', countersignedByName: 'Hester Quarmby', countersignedAt: '2026-08-09T09:00:00Z' };
    const withBlock = texts(LOG_SHEET_SECTION.close(ctx({ run, site: { wetSignature: true } })));
    expect(withBlock).toContain('Hester Quarmby (chief engineer), 09 Aug 2026 04:00 CDT');
    expect(withBlock).toContain('Signed on paper');
    expect(texts(LOG_SHEET_SECTION.close(ctx({ run, site: { wetSignature: false } })))).not.toContain('Signed on paper');
  });
});
