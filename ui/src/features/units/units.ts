import { UNIT_LABELS, type UnitConversionTable, type UnitSystem } from '@crankjournal/shared-types';

/** A stored value as a person sees it in their unit system. */
export interface DisplayValue {
  /** The converted number (null when there is no value). */
  value: number | null;
  /** The display unit's code, e.g. "degC". */
  unit: string;
  /** The display unit as printed, e.g. "°C". */
  unitLabel: string;
  /** The number formatted with the unit's usual decimals, e.g. "100.0" (an em dash when there is no value). */
  text: string;
  /** Number and unit together, e.g. "100.0 °C". */
  label: string;
  /** True when the value was converted from another unit. */
  converted: boolean;
}

export interface DisplayOptions {
  /** Decimals for the value in its stored unit (scaled when converted); defaults to the display unit's usual decimals. */
  decimals?: number;
  /**
   * True for a difference or a rate (rise per minute, rise above ambient, deadband): only the factor applies,
   * never the offset, because a difference of 9 °F is a difference of 5 °C.
   */
  delta?: boolean;
}

/** Usual decimals per display unit: what a gauge or thermometer on the engine can be read to. */
export const UNIT_DECIMALS: Record<string, number> = {
  psig: 1,
  psia: 1,
  psi: 1,
  kPa: 0,
  bar: 2,
  inHg: 1,
  rpm: 1,
  degF: 0,
  degC: 1,
  'drops/min': 0,
  'pint/h': 2,
  'mL/h': 0,
  in: 3,
  mm: 1,
};

/** The printed form of a unit code; unknown codes print as themselves. */
export function unitLabel(unit: string): string {
  return UNIT_LABELS[unit] ?? unit;
}

/** Formats a number with fixed decimals and the reader's digit grouping. */
export function formatNumber(value: number, decimals: number): string {
  return value.toLocaleString(undefined, { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
}

/**
 * Converts a stored value to the person's unit system with the server's table: display = value × factor + offset.
 * A unit with no entry in the table is shown as stored.
 */
export function convertForDisplay(
  value: number | null | undefined,
  storedUnit: string,
  table: UnitConversionTable | undefined,
  system: UnitSystem,
  opts: DisplayOptions = {},
): DisplayValue {
  const conv = table?.[system]?.[storedUnit];
  const converted = !!conv && conv.to !== storedUnit;
  const unit = converted ? conv.to : storedUnit;
  // Decimals asked for are for the stored unit; a conversion keeps about the same precision (in → mm: two fewer).
  const decimals =
    opts.decimals === undefined
      ? (UNIT_DECIMALS[unit] ?? 1)
      : converted && conv.factor !== 0
        ? Math.max(0, Math.round(opts.decimals - Math.log10(Math.abs(conv.factor))))
        : opts.decimals;
  const label = unitLabel(unit);
  if (value === null || value === undefined || !Number.isFinite(value)) {
    return { value: null, unit, unitLabel: label, text: '—', label: `— ${label}`, converted };
  }
  const out = converted ? value * conv.factor + (opts.delta ? 0 : conv.offset) : value;
  // Avoid printing "-0.0" for values that round to zero.
  const rounded = Math.abs(out) < 0.5 * 10 ** -decimals ? 0 : out;
  const text = formatNumber(rounded, decimals);
  return { value: out, unit, unitLabel: label, text, label: `${text} ${label}`, converted };
}
