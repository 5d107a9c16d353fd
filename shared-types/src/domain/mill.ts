import type { Role } from './roles.js';
import type { RunState } from './run.js';

/** Who may describe the mill, plan schedules, log passes and handle customer lots. Everyone else reads. */
export const MILL_WRITERS: readonly Role[] = ['mill_lead', 'chief_engineer'];

/** A bar's cross-section: rectangle (flat or square, box passes), round (height = width = diameter), oval. */
export const SECTION_SHAPES = ['rectangle', 'round', 'oval'] as const;
export type SectionShape = (typeof SECTION_SHAPES)[number];
export const SECTION_SHAPE_LABELS: Record<SectionShape, string> = { rectangle: 'Rectangle / square', round: 'Round', oval: 'Oval' };

/** What a schedule or a lot makes. */
export const PRODUCT_SHAPES = ['flat', 'square', 'round'] as const;
export type ProductShape = (typeof PRODUCT_SHAPES)[number];
export const PRODUCT_SHAPE_LABELS: Record<ProductShape, string> = { flat: 'Flat bar', square: 'Square bar', round: 'Round bar' };

/**
 * A customer lot moves one step at a time, in this order, in the works' own words: chalked on the order slate,
 * priced (a quote sent), ordered (the customer took it), on the roll plan, rolled, passed inspection, dispatched.
 */
export const LOT_STATUSES = ['on_the_slate', 'priced', 'ordered', 'on_roll_plan', 'rolled', 'passed', 'dispatched'] as const;
export type LotStatus = (typeof LOT_STATUSES)[number];
export const LOT_STATUS_LABELS: Record<LotStatus, string> = {
  on_the_slate: 'On the slate',
  priced: 'Priced',
  ordered: 'Ordered',
  on_roll_plan: 'On the roll plan',
  rolled: 'Rolled',
  passed: 'Passed inspection',
  dispatched: 'Dispatched',
};
/** The words of the button that moves a lot into each state. */
export const LOT_STATUS_ACTIONS: Record<LotStatus, string> = {
  on_the_slate: 'Put on the slate',
  priced: 'Mark priced',
  ordered: 'Mark ordered',
  on_roll_plan: 'Put on the roll plan',
  rolled: 'Mark rolled',
  passed: 'Pass inspection',
  dispatched: 'Mark dispatched',
};
/** A bar-lot number: BL, the two-digit year of the enquiry, a dash and the lot's number in that year (BL26-014). */
export function barLotNumber(year: number, n: number): string {
  return `BL${String(year % 100).padStart(2, '0')}-${String(n).padStart(3, '0')}`;
}
/** The one status a lot may move to next, or null when dispatched. */
export function nextLotStatus(s: LotStatus): LotStatus | null {
  const i = LOT_STATUSES.indexOf(s);
  return i >= 0 && i < LOT_STATUSES.length - 1 ? LOT_STATUSES[i + 1] : null;
}
/** Lot statuses in which a new quote may be made (after acceptance the price is fixed). */
export const LOT_STATUSES_OPEN_TO_QUOTES: readonly LotStatus[] = ['on_the_slate', 'priced'];

/** Passes are logged while the engine runs, or after it stops until the run is closed. */
export const RUN_STATES_LOGGING_PASSES: readonly RunState[] = ['running', 'stopped'];

/** Codes of the warnings on a pass. */
export const PASS_WARNING_CODES = ['stand_force', 'bite', 'speed_drop', 'stall', 'no_surplus_power'] as const;
export type PassWarningCode = (typeof PASS_WARNING_CODES)[number];

const MM_PER_INCH = 25.4;
const FRACTIONS: Record<number, string> = { 1: '⅛', 2: '¼', 3: '⅜', 4: '½', 5: '⅝', 6: '¾', 7: '⅞' };
/** Inches as the trade writes them (1½ in) when the size is a whole number of eighths, else to two decimals. */
export function inchesText(mm: number): string {
  const inches = mm / MM_PER_INCH;
  const eighths = Math.round(inches * 8);
  if (Math.abs(inches * 8 - eighths) < 0.02 && eighths > 0) {
    const whole = Math.floor(eighths / 8);
    const frac = FRACTIONS[eighths % 8] ?? '';
    return `${whole || !frac ? whole : ''}${frac} in`;
  }
  return `${inches.toFixed(2)} in`;
}
const mmText = (mm: number) => `${Number(mm.toFixed(1))} mm`;
/** "Round bar 38.1 mm (1½ in)", "Flat bar 50.8 × 12.7 mm (2 × ½ in)". */
export function productLabel(shape: ProductShape, heightMm: number, widthMm: number): string {
  if (shape === 'flat') {
    return (
      `${PRODUCT_SHAPE_LABELS.flat} ${Number(widthMm.toFixed(1))} × ${mmText(heightMm)} ` +
      `(${inchesText(widthMm).replace(' in', '')} × ${inchesText(heightMm)})`
    );
  }
  return `${PRODUCT_SHAPE_LABELS[shape]} ${mmText(heightMm)} (${inchesText(heightMm)})`;
}
/** "76.2 × 76.2 mm rectangle", "Ø 38.1 mm round", "30 × 60 mm oval" (height × width). */
export function sectionText(s: { shape: SectionShape; heightMm: number; widthMm: number }): string {
  if (s.shape === 'round') return `Ø ${mmText(s.heightMm)}`;
  return `${Number(s.heightMm.toFixed(1))} × ${mmText(s.widthMm)}${s.shape === 'oval' ? ' oval' : ''}`;
}
