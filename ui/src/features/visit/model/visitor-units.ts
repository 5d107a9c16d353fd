import type { VisitorFigures } from '@crankjournal/shared-types';

export type VisitorUnits = 'metric' | 'imperial';

/** Regions whose people read pounds per square inch and horsepower first (common practice, no source). */
const IMPERIAL_REGIONS = new Set(['US', 'LR', 'MM']);

/** The visitor's units from their locale (e.g. "en-US" → imperial, "en-GB" or "de-DE" → metric). */
export function unitsForLocale(locale: string | undefined): VisitorUnits {
  if (!locale) return 'metric';
  try {
    const region = new Intl.Locale(locale).maximize().region;
    return region && IMPERIAL_REGIONS.has(region) ? 'imperial' : 'metric';
  } catch {
    return 'metric';
  }
}

export interface VisitorFigureText {
  value: string;
  unit: string;
}

const fmt = (v: number, decimals: number, locale?: string) =>
  v.toLocaleString(locale, { minimumFractionDigits: decimals, maximumFractionDigits: decimals });

/** The figures as a visitor reads them, in their units; a dash when there is no figure. */
export function figureTexts(f: VisitorFigures, units: VisitorUnits, locale?: string) {
  const dash = '—';
  const or = (v: number | null, d: number) => (v === null ? dash : fmt(v, d, locale));
  return {
    speed: { value: or(f.speedRpm, 0), unit: 'turns a minute' },
    revolutions: { value: or(f.revolutionsSinceStart, 0), unit: 'turns since the start' },
    pressure:
      units === 'metric'
        ? { value: or(f.steamPressureBar, 1), unit: 'bar' }
        : { value: or(f.steamPressurePsig, 0), unit: 'lb per square inch' },
    power:
      units === 'metric'
        ? { value: or(f.indicatedKilowatts, 0), unit: 'kilowatts' }
        : { value: or(f.indicatedHorsepower, 0), unit: 'horsepower' },
    horses: or(f.horses, 0),
    cars: or(f.smallCarEngines, 1),
  } satisfies Record<string, VisitorFigureText | string>;
}
