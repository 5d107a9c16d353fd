import {
  CYLINDER_END_LABELS,
  TRACE_ORIGIN_LABELS,
  type CardDto,
  type CylinderEnd,
  type FieldChange,
  type TraceOrigin,
} from '@crankjournal/shared-types';
import { formatNumber } from '../../units/units';

export const fmt = (v: number | null | undefined, decimals = 1) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : formatNumber(v, decimals);
export const pct = (fraction: number | null | undefined, decimals = 0) =>
  fraction === null || fraction === undefined ? '—' : `${formatNumber(fraction * 100, decimals)} %`;

export const endLabel = (end: CylinderEnd) => CYLINDER_END_LABELS[end];
export const cardTitle = (c: Pick<CardDto, 'cylinderLabel' | 'end'>) => `${c.cylinderLabel} ${CYLINDER_END_LABELS[c.end].toLowerCase()}`;

export const whenShort = (iso: string) =>
  new Date(iso).toLocaleString(undefined, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });
export const timeOnly = (iso: string) => new Date(iso).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });

/** Words and units for the fields an amendment may change. */
const FIELD_WORDS: Record<string, { label: string; unit?: string; decimals?: number }> = {
  method: { label: 'Method' },
  springPsiPerIn: { label: 'Spring', unit: 'psi/in', decimals: 0 },
  lengthIn: { label: 'Card length', unit: 'in', decimals: 2 },
  areaSqIn: { label: 'Area', unit: 'in²', decimals: 2 },
  ordinatesIn: { label: 'Mid-ordinates', unit: 'in' },
  givenMeanEffectivePressurePsi: { label: 'MEP typed in', unit: 'psi', decimals: 1 },
  imageId: { label: 'Image' },
  trace: { label: 'Trace' },
  traceOrigin: { label: 'Trace made' },
  cutOffPercent: { label: 'Cut-off', unit: '%', decimals: 0 },
  compressionPercent: { label: 'Compression from', unit: '%', decimals: 0 },
  admissionPressurePsig: { label: 'Admission read off the card', unit: 'psig', decimals: 1 },
  note: { label: 'Note' },
  meanEffectivePressurePsi: { label: 'Mean effective pressure', unit: 'psi', decimals: 1 },
  totalIndicatedHorsepower: { label: 'Set total', unit: 'ihp', decimals: 0 },
  takenAt: { label: 'Taken at' },
  speedRpm: { label: 'Speed', unit: 'rpm', decimals: 1 },
  speedSource: { label: 'Speed from' },
  throttlePressurePsig: { label: 'Throttle', unit: 'psig', decimals: 1 },
  receiverPressurePsig: { label: 'Receiver', unit: 'psig', decimals: 1 },
  vacuumInHg: { label: 'Vacuum', unit: 'inHg', decimals: 1 },
  notes: { label: 'Notes' },
  measuredAt: { label: 'Measured at' },
  brakeHorsepower: { label: 'Output', unit: 'hp', decimals: 0 },
  netBrakeLoadLbf: { label: 'Net brake load', unit: 'lbf', decimals: 0 },
  drumDiameterFt: { label: 'Drum diameter', unit: 'ft', decimals: 2 },
  ropeDiameterFt: { label: 'Rope diameter', unit: 'ft', decimals: 3 },
  torqueLbfFt: { label: 'Torque', unit: 'lbf·ft', decimals: 0 },
};

/** One stored value of an amendment, as a person reads it. */
export function changeValue(field: string, v: unknown): string {
  const w = FIELD_WORDS[field];
  if (v === null || v === undefined || v === '') return 'none';
  if (field === 'trace' && typeof v === 'object') return `${((v as { pointsPx?: unknown[] }).pointsPx ?? []).length} points`;
  if (field === 'imageId') return 'an image';
  if (field === 'traceOrigin' && typeof v === 'string') return TRACE_ORIGIN_LABELS[v as TraceOrigin] ?? v;
  if ((field === 'takenAt' || field === 'measuredAt') && typeof v === 'string') return whenShort(v);
  if (Array.isArray(v))
    return v.map((x) => (typeof x === 'number' ? formatNumber(x, 2) : String(x))).join(', ') + (w?.unit ? ` ${w.unit}` : '');
  if (typeof v === 'number') return `${formatNumber(v, w?.decimals ?? 2)}${w?.unit ? ` ${w.unit}` : ''}`;
  return String(v);
}
export const changeLabel = (c: FieldChange) => FIELD_WORDS[c.field]?.label ?? c.field;
