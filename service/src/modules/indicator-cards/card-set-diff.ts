import type { FieldChange } from '@crankjournal/shared-types';

/**
 * What an amendment of a card or a card set changed: the fields compared and the field-by-field difference
 * between the record as stored and as amended.
 */

/** The figures of a card that an amendment compares. */
export const CARD_FIELDS = [
  'method',
  'springPsiPerIn',
  'lengthIn',
  'areaSqIn',
  'ordinatesIn',
  'givenMeanEffectivePressurePsi',
  'imageId',
  'trace',
  'traceOrigin',
  'cutOffPercent',
  'compressionPercent',
  'admissionPressurePsig',
  'note',
  'meanEffectivePressurePsi',
] as const;
export const SET_FIELDS = [
  'takenAt',
  'speedRpm',
  'speedSource',
  'cutOffPercent',
  'throttlePressurePsig',
  'receiverPressurePsig',
  'vacuumInHg',
  'barometerInHg',
  'notes',
] as const;

/** JSON with object keys in order (jsonb keeps its own key order, so plain JSON.stringify would see changes that are not). */
function stableJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(stableJson).join(',')}]`;
  if (v && typeof v === 'object') {
    const o = v as Record<string, unknown>;
    return `{${Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${stableJson(o[k])}`)
      .join(',')}}`;
  }
  return JSON.stringify(v ?? null);
}
const same = (a: unknown, b: unknown) => stableJson(a ?? null) === stableJson(b ?? null);
const plain = (v: unknown) => (v instanceof Date ? v.toISOString() : (v ?? null));

/** The fields that differ between two records, as stored. */
export function changesBetween<T extends object>(before: T, after: Partial<T>, fields: readonly (keyof T & string)[]): FieldChange[] {
  return fields
    .filter((f) => f in after && !same(plain(before[f]), plain(after[f])))
    .map((f) => ({ field: f, from: plain(before[f]), to: plain(after[f]) }));
}
