import type { RunState } from '../domain/run.js';
import type { BearingKind, CylinderRole, EngineType, LubricationKind, MeasurementKind, MeasurementUnit } from '../domain/engine.js';

export interface CylinderDto {
  id?: string;
  label: string;
  role: CylinderRole;
  boreIn: number;
  strokeIn: number;
  pistonRodIn: number;
  tailRodIn: number;
  clearancePercent: number;
}
export interface LubricationPointDto {
  id?: string;
  label: string;
  kind: LubricationKind;
  oilGrade: string;
}
export interface BearingDto {
  id?: string;
  label: string;
  kind: BearingKind;
  journalDiameterIn: number;
  journalLengthIn: number;
  /** Share of the rotating load this bearing carries, percent. */
  loadSharePercent: number;
  radialClearanceIn?: number | null;
  /** Label of the lubrication point that feeds it (resolved by label on write). */
  lubricationPointLabel?: string | null;
  lubricationPointId?: string | null;
}
export interface MeasurementPointDto {
  id?: string;
  /** Short stable code used by loggers and CSV files, e.g. "MB1-T". */
  code: string;
  label: string;
  kind: MeasurementKind;
  unit: MeasurementUnit;
  /** Order in the round of readings. */
  sequence: number;
  normalLow?: number | null;
  normalHigh?: number | null;
  lowLimit?: number | null;
  highLimit?: number | null;
  highHighLimit?: number | null;
  maxRiseRatePerMin?: number | null;
  maxRiseAboveAmbient?: number | null;
  deadband?: number | null;
  /** An absolute limit (high-high, high) suppresses this point's rise-above-ambient and rate-of-rise alarms; default true. */
  relatedSuppression?: boolean;
  /** Run states in which this point's alarms are suppressed (not meaningful), e.g. oil pressure low while 'preparing'. */
  suppressedInStates?: RunState[];
  bearingLabel?: string | null;
  bearingId?: string | null;
  cylinderLabel?: string | null;
  cylinderId?: string | null;
}
export interface EngineSummary {
  id: string;
  name: string;
  builder: string;
  yearBuilt: string;
  type: EngineType;
  ratedSpeedRpm: number;
  overspeedRpm: number;
  mawpPsig: number;
  preLubeFreshnessMinutes: number;
  runningHours: number;
  revolutions: number;
  activeRunId: string | null;
}
export interface EngineDetail extends EngineSummary {
  notes: string;
  /** Minutes a high-high alarm may wait unacknowledged before the call list is e-mailed. */
  escalateAfterMinutes: number;
  /** People (user ids), in order, e-mailed about a high-high alarm nobody acknowledged in time. */
  callList: string[];
  flywheelMassLb: number | null;
  flywheelRadiusOfGyrationFt: number | null;
  rotatingWeightLb: number | null;
  cylinders: (CylinderDto & { id: string })[];
  bearings: (BearingDto & { id: string })[];
  lubricationPoints: (LubricationPointDto & { id: string })[];
  measurementPoints: (MeasurementPointDto & { id: string })[];
}
export interface EngineWriteRequest {
  name: string;
  builder: string;
  yearBuilt: string;
  type: EngineType;
  ratedSpeedRpm: number;
  overspeedRpm: number;
  mawpPsig: number;
  preLubeFreshnessMinutes: number;
  notes?: string;
  /** Left out: unchanged (5 minutes for a new engine). */
  escalateAfterMinutes?: number;
  /** Left out: unchanged (empty for a new engine). */
  callList?: string[];
  flywheelMassLb?: number | null;
  flywheelRadiusOfGyrationFt?: number | null;
  rotatingWeightLb?: number | null;
  cylinders: CylinderDto[];
  lubricationPoints: LubricationPointDto[];
  bearings: BearingDto[];
  measurementPoints: MeasurementPointDto[];
}
/** One change to a limit or engine setting, kept for the record. */
export interface LimitChangeDto {
  id: string;
  engineId: string;
  subject: string;
  field: string;
  oldValue: number | string | null;
  newValue: number | string | null;
  changedBy: string;
  changedByName: string;
  changedAt: string;
}
/** Linear conversion of a stored unit to the user's display unit: display = value × factor + offset (from mathjs). */
export interface UnitConversion {
  from: string;
  to: string;
  factor: number;
  offset: number;
}
export type UnitConversionTable = Record<'imperial' | 'metric', Record<string, UnitConversion>>;
