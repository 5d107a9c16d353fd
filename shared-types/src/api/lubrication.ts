import type { BearingKind, LubricationKind } from '../domain/engine.js';

// ---------------------------------------------------------------------------------------------
// Oils and lubrication points
// ---------------------------------------------------------------------------------------------

export interface OilWriteRequest {
  name: string;
  /** e.g. "ISO VG 150". */
  grade: string;
  viscosity40cSt: number;
  viscosity100cSt: number;
  densityKgM3At15C?: number | null;
  /** Where the figures come from: a data sheet, or "typical of the grade". */
  figuresSource: string;
  notes?: string;
}
export interface OilDto extends OilWriteRequest {
  id: string;
  densityKgM3At15C: number | null;
  notes: string;
}
export interface LubricationPointOilDto {
  lubricationPointId: string;
  engineId: string;
  label: string;
  kind: LubricationKind;
  /** The grade written on the engine's description. */
  oilGradeText: string;
  oilId: string | null;
  oilName: string | null;
  /** assigned: chosen here; grade: matched by the grade text; null: no oil known. */
  matchedBy: 'assigned' | 'grade' | null;
  bearings: { id: string; label: string }[];
}
export interface AssignPointOilRequest {
  /** null to clear the assignment (the grade text is matched again). */
  oilId: string | null;
}

// ---------------------------------------------------------------------------------------------
// Consumption
// ---------------------------------------------------------------------------------------------

export const CONSUMPTION_METHODS = ['added', 'levels'] as const;
export type ConsumptionMethod = (typeof CONSUMPTION_METHODS)[number];
export interface ConsumptionEntryRequest {
  runId: string;
  lubricationPointId: string;
  /** added: the quantity put in to make up; levels: the reservoir's contents before and after the run. */
  method: ConsumptionMethod;
  quantityLitres?: number | null;
  levelStartLitres?: number | null;
  levelEndLitres?: number | null;
  note?: string;
}
export interface ConsumptionEntryDto {
  id: string;
  runId: string;
  runTitle: string;
  lubricationPointId: string;
  method: ConsumptionMethod;
  quantityLitres: number | null;
  levelStartLitres: number | null;
  levelEndLitres: number | null;
  usedLitres: number;
  note: string;
  recordedByName: string;
  recordedAt: string;
}
export interface ConsumptionRunRow {
  runId: string;
  title: string;
  startedAt: string | null;
  usedLitres: number;
  runHours: number;
  revolutions: number;
  litresPerRunHour: number | null;
  litresPerThousandRevolutions: number | null;
}
export interface ConsumptionTrend {
  /** Latest run's litres per thousand revolutions against the median of the runs before it. */
  latest: number | null;
  earlierMedian: number | null;
  changePercent: number | null;
  direction: 'rising' | 'steady' | 'falling' | null;
  ruleText: string;
}
export interface PointConsumption {
  lubricationPointId: string;
  label: string;
  kind: LubricationKind;
  oilName: string | null;
  runs: ConsumptionRunRow[];
  totalLitres: number;
  trend: ConsumptionTrend;
}
export interface EngineLubrication {
  engineId: string;
  engineName: string;
  points: LubricationPointOilDto[];
  consumption: PointConsumption[];
  entries: ConsumptionEntryDto[];
}

// ---------------------------------------------------------------------------------------------
// Main-bearing figures for a run
// ---------------------------------------------------------------------------------------------

export interface BearingLubricationRow {
  bearingId: string;
  label: string;
  kind: BearingKind;
  oilName: string | null;
  /** Mean bearing temperature over the run, °C (the oil film's temperature is taken as the metal's). */
  temperatureC: number | null;
  speedRpm: number | null;
  loadLbf: number | null;
  kinematicCst: number | null;
  dynamicPaS: number | null;
  dynamicReyn: number | null;
  densityAssumed: boolean;
  unitLoadPsi: number | null;
  frictionTorqueLbfIn: number | null;
  frictionCoefficient: number | null;
  powerLossHp: number | null;
  sommerfeldNumber: number | null;
  /** What is missing for the figures that are null. */
  missing: string[];
}
export interface BearingLubricationAnalysis {
  engineId: string;
  runId: string | null;
  runTitle: string | null;
  rotatingWeightLb: number | null;
  rows: BearingLubricationRow[];
  notes: string[];
}

// ---------------------------------------------------------------------------------------------
// Stateless calculators (POST /api/calculations/...)
// ---------------------------------------------------------------------------------------------

export interface OilViscosityRequest {
  viscosity40cSt: number;
  viscosity100cSt: number;
  temperatureC: number;
  /** Density at 15 °C; a typical mineral oil is assumed when omitted. */
  densityKgM3At15C?: number;
}
export interface OilViscosityResponse {
  kinematicCst: number;
  densityKgM3: number;
  densityAssumed: boolean;
  dynamicPaS: number;
  dynamicReyn: number;
  method: string;
}
export interface JournalFrictionRequest {
  diameterIn: number;
  lengthIn: number;
  radialClearanceIn: number;
  speedRpm: number;
  viscosityReyn: number;
  loadLbf: number;
}
export interface JournalFrictionResponse {
  frictionTorqueLbfIn: number;
  frictionCoefficient: number;
  powerLossHp: number;
  powerLossKw: number;
  sommerfeldNumber: number;
  unitLoadPsi: number;
  method: string;
}
export interface LiftPressureRequest {
  loadLbf: number;
  pocketAreaIn2: number;
  breakawayFactor?: number;
}
export interface LiftPressureResponse {
  liftPressurePsi: number;
  pumpPressurePsi: number;
  breakawayFactor: number;
  pumpPressureRangePsi: { min: number; max: number };
  rule: string;
  caution: string;
}
export interface JackCapacityRequest {
  jackCount: number;
  jackCapacityShortTons: number;
  loadLbf: number;
  requiredMargin?: number;
}
export interface JackCapacityResponse {
  capacityShortTons: number;
  loadShortTons: number;
  margin: number;
  requiredMargin: number;
  belowRequiredMargin: boolean;
  rule: string;
  caution: string;
}
