import type { LotStatus, PassWarningCode, ProductShape, SectionShape } from '../domain/mill.js';
import type { RunState } from '../domain/run.js';
import type { AlarmDto } from './runs.js';

/** A bar's cross-section in millimetres (a round has height = width = diameter). */
export interface SectionDto {
  shape: SectionShape;
  heightMm: number;
  widthMm: number;
}

// ---------------------------------------------------------------- the mill

export interface MillStandDto {
  id?: string;
  /** 1 = first stand the bar meets. */
  position: number;
  name: string;
  rollDiameterMm: number;
  barrelLengthMm: number;
  /** roll speed ÷ engine speed (1 where a pinion stand drives the rolls at engine speed) */
  rollSpeedRatio: number;
  maxSeparatingForceKn: number;
  notes?: string;
}
/** Site settings for the pass checks. */
export interface MillSettings {
  /** warn when a pass would pull the speed under this fraction of rated speed */
  minSpeedFraction: number;
  mechanicalEfficiency: number;
  /** load the engine carries besides the pass (pinion stand, idle stands, shafting), hp */
  baseLoadHp: number;
  /** indicated hp used for logged passes and plans when the run has no indicator card figure */
  defaultIndicatedHp: number;
  /** allowance on the frictionless roll force (1.2 ≈ 20 %) */
  frictionFactor: number;
}
/** Site-set rates for quotes. */
export interface QuoteRates {
  /** ISO 4217 code, e.g. GBP */
  currency: string;
  stockRatePerTonne: number;
  /** stock weight lost to scale, crops and rejects, percent of the stock */
  yieldLossPct: number;
  engineRatePerHour: number;
  crewRatePerPersonHour: number;
  crewSize: number;
  fixedCosts: { label: string; amount: number }[];
  contingencyPct: number;
  marginPct: number;
}
export interface MillWriteRequest {
  name: string;
  engineId: string;
  notes?: string;
  stands: MillStandDto[];
  settings: MillSettings;
  quoteRates: QuoteRates;
}
export interface MillDto extends MillWriteRequest {
  id: string;
  engineName: string;
  engine: { ratedSpeedRpm: number; flywheelMassLb: number | null; flywheelRadiusOfGyrationFt: number | null };
  stands: (MillStandDto & { id: string })[];
  notes: string;
  updatedAt: string;
}

// ---------------------------------------------------------------- pass calculation

export interface FlowStressDto {
  model: 'misaka' | 'given';
  /** the model, named and cited */
  citation: string;
  meanFlowStressMPa: number;
  /** used outside the range the equation was fitted over (e.g. a slow mill's strain rate) */
  extrapolated: boolean;
  outOfRange: string[];
}
export interface PassFlywheelDto {
  inertiaKgM2: number;
  storedEnergyKj: number;
  startSpeedRpm: number;
  endSpeedRpm: number;
  speedDropRpm: number;
  minAllowedSpeedRpm: number;
  belowMinSpeed: boolean;
  stalled: boolean;
  barExitLengthM: number;
  passDurationS: number;
  passEnergyKj: number;
  energyFromFlywheelKj: number;
  indicatedHp: number;
  /** where the indicated hp came from */
  indicatedHpSource: string;
  /** where the speed at the start of the pass came from */
  startSpeedSource: string;
  surplusPowerHp: number;
  /** null when the engine has nothing to spare */
  recoveryTimeS: number | null;
}
export interface PassWarningDto {
  code: PassWarningCode;
  message: string;
}
export interface PassCalculationDto {
  entryAreaMm2: number;
  exitAreaMm2: number;
  draftMm: number;
  /** height reduction, fraction */
  reduction: number;
  /** area reduction, fraction */
  areaReduction: number;
  /** entry area ÷ exit area */
  elongation: number;
  trueStrain: number;
  contactLengthMm: number;
  meanWidthMm: number;
  rollSpeedRpm: number;
  rollSurfaceSpeedMPerS: number;
  meanStrainRatePerS: number;
  flowStress: FlowStressDto;
  frictionFactor: number;
  /** roll–stock friction coefficient the bite check (and a plane-strain force) used */
  frictionCoefficient: number;
  /** the largest draft the rolls bite unaided, μ²·R, mm */
  maxBiteDraftMm: number;
  bites: boolean;
  /** 'simple': L·w·σ̄·frictionFactor; 'plane_strain': L·w·(2/√3)·σ̄·Q */
  forceModel: 'simple' | 'plane_strain';
  /** Q, the roll-gap geometry factor (plane-strain model only) */
  geometryFactor: number | null;
  /** which model each figure used, in words */
  models: { strain: string; flowStress: string; force: string; bite: string };
  forceKn: number;
  forceLbf: number;
  torquePerRollKnM: number;
  torquePerRollLbfFt: number;
  powerRollPairKw: number;
  powerRollPairHp: number;
  standMaxForceKn: number;
  standForceUtilisation: number;
  exceedsStandForce: boolean;
  flywheel: PassFlywheelDto | null;
  warnings: PassWarningDto[];
}

/** The stateless calculator: one pass, flat body, units in the names. */
export interface RollingPassRequest {
  rollDiameterMm: number;
  entryThicknessMm: number;
  exitThicknessMm: number;
  entryWidthMm: number;
  exitWidthMm?: number;
  entryShape?: SectionShape;
  exitShape?: SectionShape;
  temperatureC: number;
  carbonPct: number;
  rollSpeedRpm: number;
  standMaxForceKn: number;
  frictionFactor?: number;
  meanFlowStressMPa?: number;
  /** roll–stock friction coefficient for the bite check; default 0.3 (hot rolling) */
  frictionCoefficient?: number;
  forceModel?: 'simple' | 'plane_strain';
  /** the flywheel group: give all of flywheelMassLb … indicatedHp, or none */
  flywheelMassLb?: number;
  flywheelRadiusOfGyrationFt?: number;
  engineSpeedRpm?: number;
  ratedSpeedRpm?: number;
  barExitLengthM?: number;
  indicatedHp?: number;
  minSpeedFraction?: number;
  mechanicalEfficiency?: number;
  baseLoadHp?: number;
  creditEngineDuringPass?: boolean;
}
export interface RollingPassResponse extends PassCalculationDto {
  caution: string;
}

// ---------------------------------------------------------------- pass schedules

export interface SchedulePassInput {
  /** the stand's position in the mill (1 = first) */
  standPosition: number;
  entry: SectionDto;
  exit: SectionDto;
  expectedTemperatureC: number;
  notes?: string;
}
export interface ScheduleWriteRequest {
  millId: string;
  name: string;
  isTemplate: boolean;
  productShape: ProductShape;
  productHeightMm: number;
  productWidthMm: number;
  steelGrade: string;
  carbonPct: number;
  stock: SectionDto;
  stockLengthMm: number;
  lotId?: string | null;
  notes?: string;
  archived?: boolean;
  passes: SchedulePassInput[];
}
export interface ScheduleCopyRequest {
  name: string;
  isTemplate?: boolean;
  millId?: string;
  lotId?: string | null;
}
export interface ScheduleSummary {
  id: string;
  millId: string;
  millName: string;
  name: string;
  isTemplate: boolean;
  archived: boolean;
  productShape: ProductShape;
  productHeightMm: number;
  productWidthMm: number;
  steelGrade: string;
  carbonPct: number;
  stock: SectionDto;
  stockLengthMm: number;
  passCount: number;
  flaggedPasses: number;
  templateId: string | null;
  templateName: string | null;
  lotId: string | null;
  lotReference: string | null;
  updatedAt: string;
}
export interface SchedulePassDto extends SchedulePassInput {
  id: string;
  seq: number;
  standName: string;
  notes: string;
  calc: PassCalculationDto | null;
  /** why the pass could not be calculated (e.g. an exit no thinner than the entry) */
  calcError: string | null;
}
export interface ScheduleDetail extends ScheduleSummary {
  notes: string;
  passes: SchedulePassDto[];
  /** stock area ÷ final area */
  totalElongation: number | null;
  finalLengthM: number | null;
  /** what the plan assumes for the flywheel check */
  assumptions: string[];
  createdByName: string;
  createdAt: string;
}

// ---------------------------------------------------------------- bars and logged passes

export interface CreateBarRequest {
  barCode: string;
  scheduleId?: string | null;
  lotId?: string | null;
  /** defaults to the schedule's stock */
  stock?: SectionDto;
  stockLengthMm?: number;
  notes?: string;
}
export interface UpdateBarRequest {
  lotId?: string | null;
  weightKg?: number | null;
  scrapped?: boolean;
  scrapReason?: string | null;
  notes?: string;
}
export interface LogPassRequest {
  /** generated by the client: the same pass sent twice is stored once */
  clientId?: string;
  passNumber: number;
  standPosition: number;
  /** ISO time of the pass; defaults to now */
  at?: string;
  measuredTemperatureC: number;
  /** measured exit size */
  exit: SectionDto;
  /** defaults to the schedule's entry for this pass, else the previous pass's exit, else the stock */
  entry?: SectionDto;
  notes?: string;
}
export interface LoggedPassDto {
  id: string;
  barId: string;
  barCode: string;
  runId: string;
  passNumber: number;
  standPosition: number;
  standName: string;
  at: string;
  measuredTemperatureC: number;
  entry: SectionDto;
  exit: SectionDto;
  /** the schedule's exit for this pass, when the bar follows a schedule */
  plannedExit: SectionDto | null;
  notes: string;
  loggedByName: string;
  calc: PassCalculationDto;
}
export interface BarDto {
  id: string;
  runId: string;
  barCode: string;
  scheduleId: string | null;
  scheduleName: string | null;
  lotId: string | null;
  lotReference: string | null;
  stock: SectionDto;
  stockLengthMm: number;
  weightKg: number | null;
  scrapped: boolean;
  scrapReason: string | null;
  notes: string;
  passes: LoggedPassDto[];
  createdAt: string;
}
export interface MillRunSummary {
  runId: string;
  title: string;
  state: RunState;
  plannedFor: string | null;
  startedAt: string | null;
  engineName: string;
  bars: number;
  passes: number;
  flaggedPasses: number;
  lotReferences: string[];
}
export interface MillRunLog {
  run: {
    id: string;
    title: string;
    state: RunState;
    engineId: string;
    engineName: string;
    plannedFor: string | null;
    startedAt: string | null;
    stoppedAt: string | null;
  };
  mill: { id: string; name: string; stands: (MillStandDto & { id: string })[] } | null;
  /** whether passes may be logged now, and if not why */
  canLog: boolean;
  reasonNotLogging: string | null;
  bars: BarDto[];
}
export interface TimelineReading {
  pointId: string;
  code: string;
  label: string;
  value: number;
  unit: string;
}
export type MillTimelineItem =
  | { kind: 'pass'; at: string; pass: LoggedPassDto }
  | { kind: 'round'; at: string; readings: TimelineReading[] }
  | { kind: 'alarm'; at: string; alarm: AlarmDto };

// ---------------------------------------------------------------- customer lots and quotes

export interface LotWriteRequest {
  customerName: string;
  customerEmail: string;
  customerContact?: string;
  productShape: ProductShape;
  productHeightMm: number;
  productWidthMm: number;
  steelGrade: string;
  carbonPct?: number | null;
  quantityTonnes: number;
  /** YYYY-MM-DD */
  dueDate: string;
  millId?: string;
  notes?: string;
}
export interface LotUpdateRequest extends Partial<LotWriteRequest> {
  producedTonnes?: number;
  scrappedTonnes?: number;
}
export interface LotTransitionRequest {
  to: LotStatus;
  note?: string;
  /** Chief engineer only: puts a lot on the roll plan before its deposit is paid, with this reason. */
  overrideReason?: string;
}
export interface LinkRunRequest {
  runId: string;
}
export interface LotSummary {
  id: string;
  reference: string;
  customerName: string;
  productShape: ProductShape;
  productHeightMm: number;
  productWidthMm: number;
  steelGrade: string;
  quantityTonnes: number;
  dueDate: string;
  status: LotStatus;
  producedTonnes: number;
  scrappedTonnes: number;
  latestQuoteTotal: number | null;
  currency: string;
  updatedAt: string;
}
export interface LotStatusChangeDto {
  from: LotStatus | null;
  to: LotStatus;
  byName: string;
  at: string;
  note: string | null;
}
export interface QuoteLineDto {
  label: string;
  quantity: number;
  unit: string;
  rate: number;
  amount: number;
}
export interface QuoteRequest {
  engineHours: number;
  crewHours: number;
  /** defaults to the site's crew size */
  crewSize?: number;
  /** defaults to the lot's quantity */
  productTonnes?: number;
  /** added to the site's fixed costs */
  extraFixedCosts?: { label: string; amount: number }[];
  notes?: string;
}
export interface QuoteDto {
  id: string;
  lotId: string;
  number: number;
  productTonnes: number;
  stockTonnes: number;
  yieldLossPct: number;
  engineHours: number;
  crewHours: number;
  crewSize: number;
  lines: QuoteLineDto[];
  subtotal: number;
  contingency: QuoteLineDto;
  margin: QuoteLineDto;
  total: number;
  currency: string;
  notes: string;
  createdByName: string;
  createdAt: string;
  sentAt: string | null;
  sentTo: string | null;
}
export interface SendQuoteRequest {
  /** defaults to the lot's customer e-mail */
  to?: string;
  message?: string;
}
export interface LotDetail extends LotSummary {
  customerEmail: string;
  customerContact: string;
  carbonPct: number | null;
  notes: string;
  millId: string | null;
  nextStatus: LotStatus | null;
  history: LotStatusChangeDto[];
  runs: { id: string; title: string; state: RunState; plannedFor: string | null }[];
  bars: { id: string; barCode: string; runId: string; runTitle: string; passes: number; weightKg: number | null; scrapped: boolean }[];
  /** tonnage from the linked bars' weights */
  barTonnes: { produced: number; scrapped: number };
  quotes: QuoteDto[];
  createdAt: string;
}
