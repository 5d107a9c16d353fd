import {
  SECTION_SHAPE_LABELS,
  inchesText,
  productLabel,
  sectionText,
  type ProductShape,
  type SectionDto,
} from '@crankjournal/shared-types';
import { formatNumber } from '../../units/units';

export { productLabel, sectionText, inchesText };

/** A number with fixed decimals and thousands separators, or an em dash. */
export function fmt(v: number | null | undefined, decimals = 0): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : formatNumber(v, decimals);
}
/** A fraction as a percentage: 0.213 → "21.3 %". */
export function pct(v: number | null | undefined, decimals = 1): string {
  return v === null || v === undefined ? '—' : `${formatNumber(v * 100, decimals)} %`;
}
/** Seconds as "12.3 s" or "1 min 05 s". */
export function seconds(v: number | null | undefined): string {
  if (v === null || v === undefined) return '—';
  if (v < 60) return `${formatNumber(v, 1)} s`;
  const m = Math.floor(v / 60);
  return `${m} min ${String(Math.round(v - m * 60)).padStart(2, '0')} s`;
}
/** "Round bar 38.1 mm (1½ in)" for a product. */
export function product(p: { productShape: ProductShape; productHeightMm: number; productWidthMm: number }): string {
  return productLabel(p.productShape, p.productHeightMm, p.productWidthMm);
}
/** A section with its shape word. */
export function sectionLong(s: SectionDto): string {
  return `${sectionText(s)} (${SECTION_SHAPE_LABELS[s.shape].toLowerCase()})`;
}
/** Money in the quote's currency. */
export function money(v: number | null | undefined, currency: string): string {
  if (v === null || v === undefined) return '—';
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(v);
  } catch {
    return `${currency} ${formatNumber(v, 2)}`;
  }
}
/** Local date and time of an ISO instant. */
export function when(iso: string | null | undefined, withDate = true): string {
  if (!iso) return '—';
  const d = new Date(iso);
  return withDate
    ? d.toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' })
    : d.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' });
}
