import type { AlarmKind, AlarmPriority } from '../domain/run.js';
import type { BearingKind } from '../domain/engine.js';

// ---------------------------------------------------------------------------------------------
// Vocabulary
// ---------------------------------------------------------------------------------------------

/** What a plan or an inspection is about. */
export const COMPONENT_KINDS = ['engine', 'bearing', 'crankshaft', 'cylinder', 'valve_gear', 'lubrication', 'bed_plate', 'other'] as const;
export type ComponentKind = (typeof COMPONENT_KINDS)[number];
export const COMPONENT_KIND_LABELS: Record<ComponentKind, string> = {
  engine: 'Whole engine',
  bearing: 'Bearing',
  crankshaft: 'Crankshaft',
  cylinder: 'Cylinder',
  valve_gear: 'Valve gear',
  lubrication: 'Lubrication',
  bed_plate: 'Bed-plate and foundation',
  other: 'Other',
};

export const INSPECTION_KINDS = ['bearing_clearance', 'crank_web_deflection', 'alignment', 'lubrication', 'general'] as const;
export type InspectionKind = (typeof INSPECTION_KINDS)[number];
export const INSPECTION_KIND_LABELS: Record<InspectionKind, string> = {
  bearing_clearance: 'Bearing clearance',
  crank_web_deflection: 'Crank web deflection',
  alignment: 'Alignment and level',
  lubrication: 'Lubrication',
  general: 'General inspection',
};

/** Kinds of measurement an inspection records against a tolerance. */
export const MEASUREMENT_ITEM_KINDS = [
  'clearance_lead_wire',
  'clearance_feeler',
  'web_deflection',
  'shaft_level',
  'squareness',
  'bedplate_level',
  'alignment_offset',
  'other',
] as const;
export type MeasurementItemKind = (typeof MEASUREMENT_ITEM_KINDS)[number];
export const MEASUREMENT_ITEM_KIND_LABELS: Record<MeasurementItemKind, string> = {
  clearance_lead_wire: 'Bearing clearance, lead wire',
  clearance_feeler: 'Bearing clearance, feeler gauge',
  web_deflection: 'Crank web deflection',
  shaft_level: 'Shaft level',
  squareness: 'Squareness of shaft to cylinder line',
  bedplate_level: 'Bed-plate level',
  alignment_offset: 'Offset from the reference line',
  other: 'Other measurement',
};

/** Units an inspection measurement may be recorded in. */
export const MAINTENANCE_UNITS = ['in', 'mm', 'in/ft', 'mm/m'] as const;
export type MaintenanceUnit = (typeof MAINTENANCE_UNITS)[number];

/**
 * Crank angles at which web deflection is read, for a horizontal engine: the dead centres and the quarters,
 * with the crank-end dead centre replaced by readings just either side of it where the connecting rod fouls
 * the gauge (common practice, no source).
 */
export const STANDARD_CRANK_ANGLES: readonly { deg: number; label: string }[] = [
  { deg: 0, label: 'Head-end dead centre (0°)' },
  { deg: 90, label: 'Quarter, 90°' },
  { deg: 165, label: 'Before crank-end dead centre (165°)' },
  { deg: 195, label: 'After crank-end dead centre (195°)' },
  { deg: 270, label: 'Quarter, 270°' },
];

/** Hazards of a piece of work; each shows its caution beside the work record. */
export const WORK_HAZARDS = ['lockout', 'lifting', 'jacking', 'raised_load', 'hot_work', 'confined_space'] as const;
export type WorkHazard = (typeof WORK_HAZARDS)[number];
export const WORK_HAZARD_LABELS: Record<WorkHazard, string> = {
  lockout: 'Lockout of the engine, steam and barring gear',
  lifting: 'Lifting heavy parts (bearing caps, shells, rods)',
  jacking: 'Jacking the shaft or flywheel',
  raised_load: 'Working under a raised load',
  hot_work: 'Hot work (burning, welding, melting white metal)',
  confined_space: 'Confined space (pit, flywheel race, condenser)',
};
const DEFER = 'Crankjournal aids a qualified crew; it never replaces local codes, the insurer\u2019s requirements or licensed practice.';
export const WORK_HAZARD_CAUTIONS: Record<WorkHazard, string> = {
  lockout:
    'Before anyone works on or in the engine: close and lock the stop valve, open the drains, take the barring gear ' +
    'out or lock it, and put a personal lock and tag on each isolation. A flywheel can turn on a whiff of steam or its own weight. ' +
    DEFER,
  lifting:
    'Bearing caps, shells and rods are heavy and awkward: use rated slings and lifting points, check the gear before ' +
    'use, keep hands out from under the load and clear the area. ' +
    DEFER,
  jacking:
    'Jacking a shaft or flywheel can kill: crib and pack under the load as it rises, never rely on hydraulics alone, ' +
    'use jacks rated with margin for the load they carry and lift evenly. ' +
    DEFER,
  raised_load:
    'Never work under a load held only by a crane, a block or hydraulics: land it on packing or support it mechanically first. ' + DEFER,
  hot_work:
    'Hot work needs a permit, a fire watch, the oil cleaned away and an extinguisher to hand; molten white metal ' +
    'burns and spits on damp surfaces. ' +
    DEFER,
  confined_space: 'Confined spaces need the air tested, a person outside, and a way out: do not enter alone. ' + DEFER,
};

// ---------------------------------------------------------------------------------------------
// Due logic (the calculation lives on the server; these are its answers)
// ---------------------------------------------------------------------------------------------

export type DueStatus = 'in_hand' | 'coming_due' | 'overrun';
export type DueCriterion = 'run_hours' | 'revolutions' | 'calendar_days';
/** Our words for an inspection plan's standing: in hand, coming due, overrun (run past its interval). */
export const DUE_STATUS_LABELS: Record<DueStatus, string> = { in_hand: 'In hand', coming_due: 'Coming due', overrun: 'Overrun' };
export const DUE_CRITERION_LABELS: Record<DueCriterion, string> = {
  run_hours: 'Running hours',
  revolutions: 'Revolutions',
  calendar_days: 'Calendar',
};

export interface DueCriterionDto {
  criterion: DueCriterion;
  interval: number;
  used: number;
  /** In the criterion's own unit (hours, revolutions, days); negative when overrun. */
  remaining: number;
  fractionRemaining: number;
  estimatedDueDate: string | null;
  /** Why there is no estimated date (a counter without a usage rate: "cannot be predicted"). */
  estimateNote: string | null;
  status: DueStatus;
}
export interface PlanDue {
  status: DueStatus;
  governing: DueCriterion;
  /** Never a future date for an overrun plan. */
  dueDate: string | null;
  /** Said beside or instead of the date: overrun on a counter, or "cannot be predicted". */
  dueDateNote: string | null;
  criteria: DueCriterionDto[];
}

// ---------------------------------------------------------------------------------------------
// Inspection plans
// ---------------------------------------------------------------------------------------------

export interface InspectionPlanWriteRequest {
  engineId: string;
  componentKind: ComponentKind;
  /** When the plan is for one bearing. */
  bearingId?: string | null;
  /** Free label for the component, e.g. "Crankshaft webs" (defaults to the bearing's label). */
  componentLabel?: string;
  title: string;
  inspectionKind: InspectionKind;
  intervalRunHours?: number | null;
  intervalRevolutions?: number | null;
  intervalDays?: number | null;
  /** When it was last done; the engine's counters at that date are taken from the run log. */
  lastDoneAt?: string;
  hazards?: WorkHazard[];
  notes?: string;
  active?: boolean;
}
export type InspectionPlanUpdateRequest = Partial<Omit<InspectionPlanWriteRequest, 'engineId'>>;

export interface InspectionPlanDto {
  id: string;
  engineId: string;
  engineName: string;
  componentKind: ComponentKind;
  bearingId: string | null;
  bearingLabel: string | null;
  componentLabel: string;
  title: string;
  inspectionKind: InspectionKind;
  intervalRunHours: number | null;
  intervalRevolutions: number | null;
  intervalDays: number | null;
  lastDoneAt: string;
  lastDoneRunHours: number;
  lastDoneRevolutions: number;
  /** The work record or inspection that last reset it, if any. */
  lastResetByWorkRecordId: string | null;
  lastResetByInspectionId: string | null;
  hazards: WorkHazard[];
  notes: string;
  active: boolean;
  due: PlanDue;
}
export interface DueList {
  /** Active plans, overrun first, then coming due, then by due date. */
  items: InspectionPlanDto[];
  ruleText: string;
  generatedAt: string;
}

// ---------------------------------------------------------------------------------------------
// Inspections
// ---------------------------------------------------------------------------------------------

export interface MeasurementItemInput {
  kind: MeasurementItemKind;
  /** Where it was taken, e.g. "Top, crank end" or "Web 1". */
  label: string;
  /** For crank web deflection: the crank angle of the reading, degrees. */
  crankAngleDeg?: number | null;
  value: number;
  unit: MaintenanceUnit;
  nominal?: number | null;
  /** The acceptance range; either end may be open. */
  toleranceMin?: number | null;
  toleranceMax?: number | null;
  note?: string;
}
export type ToleranceStatus = 'within' | 'below' | 'above' | 'no_tolerance';
export interface MeasurementItemDto extends MeasurementItemInput {
  id: string;
  crankAngleDeg: number | null;
  nominal: number | null;
  toleranceMin: number | null;
  toleranceMax: number | null;
  note: string;
  status: ToleranceStatus;
  outOfTolerance: boolean;
  /** How far beyond the nearer limit (same unit), 0 when within. */
  excess: number;
}
export interface FollowUpAction {
  text: string;
  /** The work record that carried it out, when one did. */
  workRecordId?: string | null;
}
export interface InspectionCreateRequest {
  engineId: string;
  bearingId?: string | null;
  planId?: string | null;
  /** True when this inspection completes its plan: the plan is reset to this date and the engine's counters then. */
  completesPlan?: boolean;
  kind: InspectionKind;
  title: string;
  inspectedAt: string;
  /** Who took the measurements (may differ from who records them). */
  inspectorName?: string;
  findings?: string;
  followUpActions?: FollowUpAction[];
  measurements?: MeasurementItemInput[];
  /** The alarm or run that prompted it. */
  promptedByAlarmId?: string | null;
  promptedByRunId?: string | null;
}
export interface AttachmentDto {
  id: string;
  inspectionId: string;
  kind: 'image' | 'pdf';
  filename: string;
  contentType: string;
  sizeBytes: number;
  caption: string;
  uploadedByName: string;
  uploadedAt: string;
}
export interface InspectionSummary {
  id: string;
  engineId: string;
  bearingId: string | null;
  bearingLabel: string | null;
  planId: string | null;
  kind: InspectionKind;
  title: string;
  inspectedAt: string;
  measurementCount: number;
  outOfToleranceCount: number;
  attachmentCount: number;
  findings: string;
}
export interface WebDeflectionSummary {
  /** max − min of the web deflection readings, in their unit. */
  spread: number;
  unit: MaintenanceUnit;
  readings: number;
  /**
   * The trade's judgement, pair by pair: vertical (90° against 270°) and horizontal (head-end dead centre against the
   * mean of the readings either side of crank-end dead centre), each against its own limit (the tolerance given on that
   * pair's readings). A pair without both readings is absent.
   */
  pairs: WebDeflectionPair[];
}
export interface WebDeflectionPair {
  pair: 'vertical' | 'horizontal';
  /** |difference| of the pair's readings, in their unit */
  deflection: number;
  /** the limit given on the pair's readings (null: none given) */
  limit: number | null;
  status: 'within' | 'above' | 'no_tolerance';
}
export interface InspectionDto extends InspectionSummary {
  engineName: string;
  planTitle: string | null;
  completesPlan: boolean;
  inspectorName: string;
  recordedByName: string;
  runHoursAt: number;
  revolutionsAt: number;
  followUpActions: FollowUpAction[];
  measurements: MeasurementItemDto[];
  webDeflection: WebDeflectionSummary | null;
  attachments: AttachmentDto[];
  promptedByAlarmId: string | null;
  promptedByRunId: string | null;
  promptedByRunTitle: string | null;
  /** Work records that this inspection prompted. */
  workRecords: WorkRecordSummary[];
  createdAt: string;
}

// ---------------------------------------------------------------------------------------------
// Work records
// ---------------------------------------------------------------------------------------------

export interface PartUsed {
  description: string;
  quantity: number;
  unit: string;
}
export interface WorkRecordCreateRequest {
  engineId: string;
  bearingId?: string | null;
  title: string;
  description?: string;
  /** Who did the work (names, as written in the log). */
  performedBy: string;
  parts?: PartUsed[];
  labourHours?: number;
  promptedByInspectionId?: string | null;
  /** Follow-up actions (by position) of the prompting inspection that this work carries out. */
  followUpActionIndexes?: number[];
  promptedByAlarmId?: string | null;
  hazards?: WorkHazard[];
  startedAt?: string;
  /** Plans that this work satisfies; their counters are reset when it is closed (if asked). */
  satisfiesPlanIds?: string[];
}
export type WorkRecordUpdateRequest = Partial<Omit<WorkRecordCreateRequest, 'engineId'>>;
export interface CloseWorkRecordRequest {
  /** When the work was finished (defaults to now; not in the future). */
  completedAt?: string;
  /** Plans whose counters to reset; defaults to every plan the record satisfies. Give [] to reset none. */
  resetPlanIds?: string[];
  note?: string;
}
export type WorkStatus = 'open' | 'closed';
export interface WorkRecordSummary {
  id: string;
  engineId: string;
  bearingId: string | null;
  bearingLabel: string | null;
  title: string;
  status: WorkStatus;
  startedAt: string;
  closedAt: string | null;
  hazards: WorkHazard[];
  promptedByInspectionId: string | null;
  promptedByAlarmId: string | null;
}
export interface WorkRecordDto extends WorkRecordSummary {
  engineName: string;
  description: string;
  performedBy: string;
  parts: PartUsed[];
  labourHours: number;
  recordedByName: string;
  promptedByInspectionTitle: string | null;
  promptedByAlarmMessage: string | null;
  satisfiesPlanIds: string[];
  satisfiesPlans: { id: string; title: string }[];
  closedByName: string | null;
  closeNote: string | null;
  runHoursAtCompletion: number | null;
  revolutionsAtCompletion: number | null;
  /** Plans whose counters were reset when it closed. */
  resetPlans: { id: string; title: string }[];
  createdAt: string;
}

// ---------------------------------------------------------------------------------------------
// Bearing history
// ---------------------------------------------------------------------------------------------

export type LoadMeasure = 'indicated_hp' | 'speed_rpm';
export interface BearingListItem {
  id: string;
  engineId: string;
  engineName: string;
  label: string;
  kind: BearingKind;
  pointCodes: string[];
  runCount: number;
  lastRunAt: string | null;
  /** Drift flag of the bearing's latest run. */
  latestRunDrift: boolean;
  /** Any run of the bearing flagged. */
  driftRuns: number;
  lastInspectionAt: string | null;
}
export interface BearingRunAlarm {
  id: string;
  kind: AlarmKind;
  priority: AlarmPriority;
  raisedAt: string;
  message: string;
  value: number | null;
}
export interface DriftVerdict {
  flagged: boolean;
  /** Upper band + margin at the run's load, °F of rise. */
  limitF: number;
  expectedRiseF: number;
  excessF: number;
  extrapolated: boolean;
  /** How many earlier runs the band was fitted to. */
  historyRuns: number;
  bandKind: 'regression' | 'mean';
  /** The band is the prediction interval for one more run at this coverage (e.g. 0.95)… */
  confidence: number;
  /** …with the degrees of freedom the history has (n − 2 about the line, n − 1 about the mean)… */
  degreesOfFreedom: number;
  /** …and the Student t quantile for them. */
  tQuantile: number;
  /** Half the band's width at the run's load, °F (wider away from the mean load). */
  halfWidthF: number;
}
export interface BearingRunRow {
  runId: string;
  title: string;
  startedAt: string | null;
  state: string;
  runningHours: number;
  /** The bearing's temperature point and unit (degF or degC). */
  pointCode: string;
  unit: string;
  peakTemperature: number;
  meanTemperature: number;
  readings: number;
  /** Mean ambient over the run, in the bearing's unit; null without ambient readings. */
  ambientMean: number | null;
  /** Peak minus mean ambient, °F (a difference). */
  riseAtPeakF: number | null;
  meanSpeedRpm: number | null;
  indicatedHp: number | null;
  /** The load figure the band uses for this run (indicated hp or speed). */
  load: number | null;
  alarms: BearingRunAlarm[];
  /** null when the run cannot be judged (no ambient, no load, or no earlier runs). */
  drift: DriftVerdict | null;
  driftNote: string | null;
}
export interface DriftBandDto {
  kind: 'regression' | 'mean';
  interceptF: number;
  slopeFPerLoad: number;
  residualSdF: number;
  /** Coverage of the prediction interval, its degrees of freedom and Student t quantile. */
  confidence: number;
  degreesOfFreedom: number;
  tQuantile: number;
  marginF: number;
  pointCount: number;
  loadMin: number;
  loadMax: number;
  /** Sampled for charts: expected, lower, upper and upper + margin (the flag line). */
  line: { load: number; expectedF: number; lowerF: number; upperF: number; limitF: number }[];
}
export interface TimelineEntry {
  at: string;
  type: 'run' | 'inspection' | 'work';
  id: string;
  title: string;
  detail: string;
  /** run: flagged by the drift rule; inspection: out of tolerance; work: open. */
  attention: boolean;
}
export interface BearingHistory {
  bearing: {
    id: string;
    label: string;
    kind: BearingKind;
    engineId: string;
    engineName: string;
    journalDiameterIn: number;
    journalLengthIn: number;
    radialClearanceIn: number | null;
    loadSharePercent: number;
    points: { id: string; code: string; unit: string }[];
  };
  loadMeasure: LoadMeasure;
  loadMeasureNote: string;
  ruleText: string;
  /** minRunsToJudge: with fewer earlier runs a run is "too few runs to judge" (no verdict). */
  settings: { confidence: number; marginF: number; minLoadSpread: number; minRunsToJudge: number };
  runs: BearingRunRow[];
  /** The band of the bearing's usual running, fitted to every run not flagged (for the chart). */
  band: DriftBandDto | null;
  inspections: InspectionSummary[];
  workRecords: WorkRecordSummary[];
  timeline: TimelineEntry[];
}
