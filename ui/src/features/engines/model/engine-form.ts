import {
  type BearingKind,
  type CylinderRole,
  type EngineDetail,
  type EngineType,
  type EngineWriteRequest,
  type LubricationKind,
  type MeasurementKind,
  type MeasurementUnit,
  type RunState,
} from '@crankjournal/shared-types';

/** A number field as the form holds it: '' while empty. */
export type Num = number | '';

let seq = 0;
/** A key for a row in the form that stays the same while the row is edited. */
export const rowKey = () => `row-${++seq}`;

export interface CylinderRow {
  key: string;
  id?: string;
  label: string;
  role: CylinderRole;
  boreIn: Num;
  strokeIn: Num;
  pistonRodIn: Num;
  tailRodIn: Num;
  clearancePercent: Num;
}
export interface LubricationRow {
  key: string;
  id?: string;
  label: string;
  kind: LubricationKind;
  oilGrade: string;
}
export interface BearingRow {
  key: string;
  id?: string;
  label: string;
  kind: BearingKind;
  journalDiameterIn: Num;
  journalLengthIn: Num;
  loadSharePercent: Num;
  radialClearanceIn: Num;
  lubricationPointLabel: string | null;
}
export interface PointRow {
  key: string;
  id?: string;
  /** An existing point the person chose to retire: left out of the request. */
  retire: boolean;
  code: string;
  label: string;
  kind: MeasurementKind;
  unit: MeasurementUnit;
  sequence: Num;
  normalLow: Num;
  normalHigh: Num;
  lowLimit: Num;
  highLimit: Num;
  highHighLimit: Num;
  maxRiseRatePerMin: Num;
  maxRiseAboveAmbient: Num;
  deadband: Num;
  /** Absolute limits suppress this point's rise-above-ambient and rate-of-rise alarms. */
  relatedSuppression: boolean;
  /** Run states in which the point's alarms are suppressed. */
  suppressedInStates: RunState[];
  /** "b:<bearing label>", "c:<cylinder label>" or null. */
  attachedTo: string | null;
}
export interface EngineFormValues {
  name: string;
  builder: string;
  yearBuilt: string;
  type: EngineType;
  ratedSpeedRpm: Num;
  overspeedRpm: Num;
  mawpPsig: Num;
  preLubeFreshnessMinutes: Num;
  notes: string;
  flywheelMassLb: Num;
  flywheelRadiusOfGyrationFt: Num;
  rotatingWeightLb: Num;
  cylinders: CylinderRow[];
  lubricationPoints: LubricationRow[];
  bearings: BearingRow[];
  measurementPoints: PointRow[];
}

const n = (v: number | null | undefined): Num => (v === null || v === undefined ? '' : v);
const orNull = (v: Num): number | null => (v === '' ? null : v);
const req = (v: Num): number => (v === '' ? NaN : v);

export const LIMIT_FIELDS = [
  'normalLow',
  'normalHigh',
  'lowLimit',
  'highLimit',
  'highHighLimit',
  'maxRiseRatePerMin',
  'maxRiseAboveAmbient',
  'deadband',
] as const;

export const emptyCylinder = (): CylinderRow => ({
  key: rowKey(),
  label: '',
  role: 'single',
  boreIn: '',
  strokeIn: '',
  pistonRodIn: '',
  tailRodIn: 0,
  clearancePercent: '',
});
export const emptyLubrication = (): LubricationRow => ({ key: rowKey(), label: '', kind: 'sight_feed', oilGrade: '' });
export const emptyBearing = (): BearingRow => ({
  key: rowKey(),
  label: '',
  kind: 'main',
  journalDiameterIn: '',
  journalLengthIn: '',
  loadSharePercent: '',
  radialClearanceIn: '',
  lubricationPointLabel: null,
});
export const emptyPoint = (sequence: number): PointRow => ({
  key: rowKey(),
  retire: false,
  code: '',
  label: '',
  kind: 'bearing_temperature',
  unit: 'degF',
  sequence,
  normalLow: '',
  normalHigh: '',
  lowLimit: '',
  highLimit: '',
  highHighLimit: '',
  maxRiseRatePerMin: '',
  maxRiseAboveAmbient: '',
  deadband: '',
  relatedSuppression: true,
  suppressedInStates: [],
  attachedTo: null,
});

export function emptyEngine(): EngineFormValues {
  return {
    name: '',
    builder: '',
    yearBuilt: '',
    type: 'simple',
    ratedSpeedRpm: '',
    overspeedRpm: '',
    mawpPsig: '',
    preLubeFreshnessMinutes: '',
    notes: '',
    flywheelMassLb: '',
    flywheelRadiusOfGyrationFt: '',
    rotatingWeightLb: '',
    cylinders: [],
    lubricationPoints: [],
    bearings: [],
    measurementPoints: [],
  };
}

/** The form's values from the engine as the server describes it. */
export function fromEngine(e: EngineDetail): EngineFormValues {
  const lubLabel = (id?: string | null) => e.lubricationPoints.find((l) => l.id === id)?.label ?? null;
  const bearingLabel = (id?: string | null) => e.bearings.find((b) => b.id === id)?.label;
  const cylinderLabel = (id?: string | null) => e.cylinders.find((c) => c.id === id)?.label;
  return {
    name: e.name,
    builder: e.builder,
    yearBuilt: e.yearBuilt,
    type: e.type,
    ratedSpeedRpm: e.ratedSpeedRpm,
    overspeedRpm: e.overspeedRpm,
    mawpPsig: e.mawpPsig,
    preLubeFreshnessMinutes: e.preLubeFreshnessMinutes,
    notes: e.notes ?? '',
    flywheelMassLb: n(e.flywheelMassLb),
    flywheelRadiusOfGyrationFt: n(e.flywheelRadiusOfGyrationFt),
    rotatingWeightLb: n(e.rotatingWeightLb),
    cylinders: e.cylinders.map((c) => ({
      key: rowKey(),
      id: c.id,
      label: c.label,
      role: c.role,
      boreIn: c.boreIn,
      strokeIn: c.strokeIn,
      pistonRodIn: c.pistonRodIn,
      tailRodIn: c.tailRodIn,
      clearancePercent: c.clearancePercent,
    })),
    lubricationPoints: e.lubricationPoints.map((l) => ({ key: rowKey(), id: l.id, label: l.label, kind: l.kind, oilGrade: l.oilGrade })),
    bearings: e.bearings.map((b) => ({
      key: rowKey(),
      id: b.id,
      label: b.label,
      kind: b.kind,
      journalDiameterIn: b.journalDiameterIn,
      journalLengthIn: b.journalLengthIn,
      loadSharePercent: b.loadSharePercent,
      radialClearanceIn: n(b.radialClearanceIn),
      lubricationPointLabel: b.lubricationPointLabel ?? lubLabel(b.lubricationPointId),
    })),
    measurementPoints: [...e.measurementPoints]
      .sort((a, b) => a.sequence - b.sequence)
      .map((p) => {
        const bl = p.bearingLabel ?? bearingLabel(p.bearingId);
        const cl = p.cylinderLabel ?? cylinderLabel(p.cylinderId);
        return {
          key: rowKey(),
          id: p.id,
          retire: false,
          code: p.code,
          label: p.label,
          kind: p.kind,
          unit: p.unit,
          sequence: p.sequence,
          normalLow: n(p.normalLow),
          normalHigh: n(p.normalHigh),
          lowLimit: n(p.lowLimit),
          highLimit: n(p.highLimit),
          highHighLimit: n(p.highHighLimit),
          maxRiseRatePerMin: n(p.maxRiseRatePerMin),
          maxRiseAboveAmbient: n(p.maxRiseAboveAmbient),
          deadband: n(p.deadband),
          relatedSuppression: p.relatedSuppression ?? true,
          suppressedInStates: p.suppressedInStates ?? [],
          attachedTo: bl ? `b:${bl}` : cl ? `c:${cl}` : null,
        };
      }),
  };
}

/** The whole engine as the PUT/POST body. Parts keep their id; references go by label; retired points are left out. */
export function toWriteRequest(v: EngineFormValues): EngineWriteRequest {
  return {
    name: v.name.trim(),
    builder: v.builder.trim(),
    yearBuilt: v.yearBuilt.trim(),
    type: v.type,
    ratedSpeedRpm: req(v.ratedSpeedRpm),
    overspeedRpm: req(v.overspeedRpm),
    mawpPsig: req(v.mawpPsig),
    preLubeFreshnessMinutes: req(v.preLubeFreshnessMinutes),
    notes: v.notes,
    flywheelMassLb: orNull(v.flywheelMassLb),
    flywheelRadiusOfGyrationFt: orNull(v.flywheelRadiusOfGyrationFt),
    rotatingWeightLb: orNull(v.rotatingWeightLb),
    cylinders: v.cylinders.map((c) => ({
      ...(c.id ? { id: c.id } : {}),
      label: c.label.trim(),
      role: c.role,
      boreIn: req(c.boreIn),
      strokeIn: req(c.strokeIn),
      pistonRodIn: req(c.pistonRodIn),
      tailRodIn: c.tailRodIn === '' ? 0 : c.tailRodIn,
      clearancePercent: req(c.clearancePercent),
    })),
    lubricationPoints: v.lubricationPoints.map((l) => ({
      ...(l.id ? { id: l.id } : {}),
      label: l.label.trim(),
      kind: l.kind,
      oilGrade: l.oilGrade.trim(),
    })),
    bearings: v.bearings.map((b) => ({
      ...(b.id ? { id: b.id } : {}),
      label: b.label.trim(),
      kind: b.kind,
      journalDiameterIn: req(b.journalDiameterIn),
      journalLengthIn: req(b.journalLengthIn),
      loadSharePercent: req(b.loadSharePercent),
      radialClearanceIn: orNull(b.radialClearanceIn),
      lubricationPointLabel: b.lubricationPointLabel,
    })),
    measurementPoints: v.measurementPoints
      .filter((p) => !p.retire)
      .map((p) => ({
        ...(p.id ? { id: p.id } : {}),
        code: p.code.trim(),
        label: p.label.trim(),
        kind: p.kind,
        unit: p.unit,
        sequence: req(p.sequence),
        normalLow: orNull(p.normalLow),
        normalHigh: orNull(p.normalHigh),
        lowLimit: orNull(p.lowLimit),
        highLimit: orNull(p.highLimit),
        highHighLimit: orNull(p.highHighLimit),
        maxRiseRatePerMin: orNull(p.maxRiseRatePerMin),
        maxRiseAboveAmbient: orNull(p.maxRiseAboveAmbient),
        deadband: orNull(p.deadband),
        relatedSuppression: p.relatedSuppression,
        suppressedInStates: p.suppressedInStates,
        bearingLabel: p.attachedTo?.startsWith('b:') ? p.attachedTo.slice(2) : null,
        cylinderLabel: p.attachedTo?.startsWith('c:') ? p.attachedTo.slice(2) : null,
      })),
  };
}

const required = (v: Num | string) => (v === '' || (typeof v === 'string' && !v.trim()) ? 'Required' : null);
const orderCheck = (lo: Num, hi: Num, what: string) => (lo !== '' && hi !== '' && lo > hi ? what : null);

/** Checks the browser can make before sending; the server checks everything again. */
export function validateEngine(v: EngineFormValues): Record<string, string> {
  const errors: Record<string, string> = {};
  const set = (path: string, msg: string | null) => {
    if (msg) errors[path] = msg;
  };
  set('name', required(v.name));
  for (const f of ['ratedSpeedRpm', 'overspeedRpm', 'mawpPsig', 'preLubeFreshnessMinutes'] as const) set(f, required(v[f]));
  if (v.ratedSpeedRpm !== '' && v.overspeedRpm !== '' && v.overspeedRpm <= v.ratedSpeedRpm)
    set('overspeedRpm', 'Must be above the rated speed');
  const dupes = (labels: string[], path: string) =>
    labels.forEach((l, i) => {
      if (l.trim() && labels.findIndex((o) => o.trim().toLowerCase() === l.trim().toLowerCase()) !== i)
        set(`${path}.${i}.label`, 'Used twice');
    });
  v.cylinders.forEach((c, i) => {
    set(`cylinders.${i}.label`, required(c.label));
    for (const f of ['boreIn', 'strokeIn', 'pistonRodIn', 'clearancePercent'] as const) set(`cylinders.${i}.${f}`, required(c[f]));
  });
  dupes(
    v.cylinders.map((c) => c.label),
    'cylinders',
  );
  v.lubricationPoints.forEach((l, i) => set(`lubricationPoints.${i}.label`, required(l.label)));
  dupes(
    v.lubricationPoints.map((l) => l.label),
    'lubricationPoints',
  );
  const lubLabels = new Set(v.lubricationPoints.map((l) => l.label.trim()));
  v.bearings.forEach((b, i) => {
    set(`bearings.${i}.label`, required(b.label));
    for (const f of ['journalDiameterIn', 'journalLengthIn', 'loadSharePercent'] as const) set(`bearings.${i}.${f}`, required(b[f]));
    if (b.lubricationPointLabel && !lubLabels.has(b.lubricationPointLabel))
      set(`bearings.${i}.lubricationPointLabel`, 'No longer in the list: choose again');
  });
  dupes(
    v.bearings.map((b) => b.label),
    'bearings',
  );
  const bearingLabels = new Set(v.bearings.map((b) => `b:${b.label.trim()}`));
  const cylLabels = new Set(v.cylinders.map((c) => `c:${c.label.trim()}`));
  const codes = v.measurementPoints.filter((p) => !p.retire).map((p) => p.code.trim().toUpperCase());
  v.measurementPoints.forEach((p, i) => {
    if (p.retire) return;
    set(`measurementPoints.${i}.code`, required(p.code));
    set(`measurementPoints.${i}.label`, required(p.label));
    set(`measurementPoints.${i}.sequence`, required(p.sequence));
    if (p.code.trim() && codes.filter((c) => c === p.code.trim().toUpperCase()).length > 1)
      set(`measurementPoints.${i}.code`, 'Used twice');
    if (p.attachedTo && !bearingLabels.has(p.attachedTo) && !cylLabels.has(p.attachedTo))
      set(`measurementPoints.${i}.attachedTo`, 'No longer in the list: choose again');
    set(`measurementPoints.${i}.normalHigh`, orderCheck(p.normalLow, p.normalHigh, 'Below the normal low'));
    set(`measurementPoints.${i}.highHighLimit`, orderCheck(p.highLimit, p.highHighLimit, 'Below the high limit'));
    set(`measurementPoints.${i}.highLimit`, orderCheck(p.lowLimit, p.highLimit, 'Below the low limit'));
  });
  return errors;
}
