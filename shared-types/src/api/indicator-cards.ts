/**
 * Indicator cards and indicated power: card sets taken during a run, the stateless calculator route,
 * traced card images and brake (measured output) figures.
 */
import type { CylinderRole } from '../domain/engine.js';

export const CYLINDER_ENDS = ['head', 'crank'] as const;
export type CylinderEnd = (typeof CYLINDER_ENDS)[number];
export const CYLINDER_END_LABELS: Record<CylinderEnd, string> = { head: 'Head end', crank: 'Crank end' };

/** How a card's mean height was found. */
export const CARD_METHODS = ['mep', 'planimeter', 'ordinates', 'trace'] as const;
export type CardMethod = (typeof CARD_METHODS)[number];
export const CARD_METHOD_LABELS: Record<CardMethod, string> = {
  mep: 'Mean effective pressure typed in',
  planimeter: 'Planimeter area',
  ordinates: 'Mid-ordinates',
  trace: 'Traced image',
};

/** Image types a card photo or scan may have (checked by content, not by name). */
export const CARD_IMAGE_TYPES = ['image/png', 'image/jpeg', 'image/webp'] as const;
export type CardImageType = (typeof CARD_IMAGE_TYPES)[number];

// ---------------------------------------------------------------------------------------------
// POST /api/calculations/indicated-power (stateless)
// ---------------------------------------------------------------------------------------------

/** One card: exactly one of meanEffectivePressurePsi; areaSqIn with lengthIn and springPsiPerIn; ordinatesIn with springPsiPerIn. */
export interface IndicatedPowerCardInput {
  end: CylinderEnd;
  meanEffectivePressurePsi?: number;
  areaSqIn?: number;
  lengthIn?: number;
  springPsiPerIn?: number;
  ordinatesIn?: number[];
}
export interface IndicatedPowerCylinderInput {
  label: string;
  boreIn: number;
  pistonRodIn: number;
  tailRodIn: number;
  /** This cylinder's stroke where it differs from the engine's, in. */
  strokeIn?: number;
  cards: IndicatedPowerCardInput[];
}
export interface IndicatedPowerRequest {
  rpm: number;
  strokeIn: number;
  cylinders: IndicatedPowerCylinderInput[];
}
export interface IndicatedPowerEndResult {
  end: CylinderEnd;
  meanEffectivePressurePsi: number;
  effectiveAreaSqIn: number;
  indicatedHorsepower: number;
}
export interface IndicatedPowerCylinderResult {
  label: string;
  indicatedHorsepower: number;
  ends: IndicatedPowerEndResult[];
}
export interface IndicatedPowerResponse {
  cylinders: IndicatedPowerCylinderResult[];
  /** Every end of every cylinder has a card. When false the totals are the sum of the cards present, not the engine's power. */
  complete: boolean;
  /** The ends without a card. */
  missingEnds: { cylinderLabel: string; end: CylinderEnd }[];
  totalIndicatedHorsepower: number;
  totalIndicatedKilowatts: number;
  /** Every cylinder's work referred to the largest cylinder's area, psi; null for an incomplete set. */
  referredMeanEffectivePressurePsi: number | null;
  /** Why the referred MEP is absent (null when it is given). */
  referredMeanEffectivePressureMissing: string | null;
}

// ---------------------------------------------------------------------------------------------
// Traced card images
// ---------------------------------------------------------------------------------------------

/** A point on the card image, in the image's own pixels (x to the right, y downward). */
export interface TracePoint {
  x: number;
  y: number;
}
/** What the person marked on a card image: calibration marks and the traced outline. */
export interface CardTrace {
  /** Two points on the atmospheric line. */
  atmosphericLine: [TracePoint, TracePoint];
  /** The admission end of the diagram (stroke fraction 0). */
  admissionEndPx: TracePoint;
  /** The release end of the diagram (stroke fraction 1). */
  releaseEndPx: TracePoint;
  /** The outline, in drawing order (closed implicitly). */
  pointsPx: TracePoint[];
  /** A known image scale (e.g. the scanner's dots per inch); otherwise the card length sets it. */
  pixelsPerInch?: number | null;
}
/** POST /api/calculations/indicator-trace: calibrate a trace without storing it. */
export interface TraceCalibrationRequest {
  trace: CardTrace;
  springPsiPerIn: number;
  /** Length of the diagram on the card, in; sets the scale unless trace.pixelsPerInch is given. */
  lengthIn?: number;
}
export interface CardOutlinePointDto {
  strokeFraction: number;
  pressurePsig: number;
}
export interface TraceCalibrationResponse {
  areaSqIn: number;
  lengthIn: number;
  meanHeightIn: number;
  meanEffectivePressurePsi: number;
  /** The top of the admission line read off the trace, psig. */
  admissionPressurePsig: number;
  horizontalPixelsPerInch: number;
  verticalPixelsPerInch: number;
  atmosphericLineTiltDeg: number;
  /** The outline in card coordinates. */
  outline: CardOutlinePointDto[];
}
/** Answer to an image upload (POST /api/runs/:runId/card-images). */
export interface CardImageDto {
  id: string;
  runId: string;
  contentType: CardImageType;
  bytes: number;
  widthPx: number;
  heightPx: number;
  uploadedAt: string;
}

// ---------------------------------------------------------------------------------------------
// Card sets
// ---------------------------------------------------------------------------------------------

/** One card of a set, as sent. Gives exactly one of meanEffectivePressurePsi, areaSqIn (+ lengthIn), ordinatesIn, trace (+ imageId). */
export interface CardInput {
  cylinderId: string;
  end: CylinderEnd;
  /** Spring scale, psi per inch of pen height (needed for area, ordinates and trace). */
  springPsiPerIn?: number | null;
  /** Length of the diagram, in (needed for an area; sets a trace's scale). */
  lengthIn?: number | null;
  areaSqIn?: number | null;
  ordinatesIn?: number[] | null;
  meanEffectivePressurePsi?: number | null;
  /** The uploaded image a trace was made on. */
  imageId?: string | null;
  trace?: CardTrace | null;
  /** Where the trace came from (with a trace). */
  traceOrigin?: TraceOrigin | null;
  /** This end's cut-off where it differs from the set's, percent of stroke. */
  cutOffPercent?: number | null;
  /** Where compression begins, percent of stroke before the end of the return stroke (for the steam accounted for). */
  compressionPercent?: number | null;
  /** Admission pressure read off the card, psig (a trace gives its own). */
  admissionPressurePsig?: number | null;
  note?: string | null;
}
/** The way a set-level pressure or speed was found. */
export type FigureSource = 'entered' | 'reading';

export interface CreateCardSetRequest {
  /** When the set was taken (ISO date-time). */
  takenAt: string;
  /** Engine speed; leave out to use the nearest speed reading of the run. */
  speedRpm?: number | null;
  /** Cut-off setting, percent of stroke, if known. */
  cutOffPercent?: number | null;
  /** Leave out to use the nearest reading of the run's throttle-pressure point. */
  throttlePressurePsig?: number | null;
  /** Leave out to use the nearest receiver-pressure reading. */
  receiverPressurePsig?: number | null;
  /** Leave out to use the nearest vacuum reading. */
  vacuumInHg?: number | null;
  /** The site barometer, inHg absolute; leave out to use the nearest barometer reading (else the standard atmosphere). */
  barometerInHg?: number | null;
  notes?: string | null;
  cards: CardInput[];
}
/** A correction of a set's own figures: only the fields given change; the reason is kept with who and when. */
export interface AmendCardSetRequest {
  takenAt?: string;
  speedRpm?: number | null;
  cutOffPercent?: number | null;
  throttlePressurePsig?: number | null;
  receiverPressurePsig?: number | null;
  vacuumInHg?: number | null;
  barometerInHg?: number | null;
  notes?: string | null;
  reason: string;
}
/** A correction of a card: its new figures in full (one way, as for a new card), and why. */
export type AmendCardRequest = Omit<CardInput, 'cylinderId' | 'end'> & { reason: string };

/** One field changed by an amendment, old and new values as stored. */
export interface FieldChange {
  field: string;
  from: unknown;
  to: unknown;
}
export interface RecordAmendmentDto {
  id: string;
  reason: string;
  by: string;
  byName: string;
  at: string;
  changes: FieldChange[];
}

export interface CardDto {
  id: string;
  cardSetId: string;
  cylinderId: string | null;
  cylinderLabel: string;
  end: CylinderEnd;
  method: CardMethod;
  springPsiPerIn: number | null;
  lengthIn: number | null;
  areaSqIn: number | null;
  ordinatesIn: number[] | null;
  /** The typed-in MEP, for a card given that way. */
  givenMeanEffectivePressurePsi: number | null;
  imageId: string | null;
  trace: CardTrace | null;
  /** Where the trace came from (null for a card given another way, or stored without saying). */
  traceOrigin: TraceOrigin | null;
  cutOffPercent: number | null;
  compressionPercent: number | null;
  admissionPressurePsig: number | null;
  note: string | null;
  /** Results of this card alone. */
  meanHeightIn: number | null;
  meanEffectivePressurePsi: number;
  /** A trace's area, in² (for a planimeter card, the area typed in). */
  tracedAreaSqIn: number | null;
  /** A trace's outline in card coordinates, for plotting. */
  outline: CardOutlinePointDto[] | null;
  createdBy: string;
  createdByName: string;
  createdAt: string;
  amendments: RecordAmendmentDto[];
}

/** The engine's cylinders as they were when the set was taken (the set keeps its own copy). */
export interface CardSetCylinder {
  cylinderId: string;
  label: string;
  role: CylinderRole;
  boreIn: number;
  strokeIn: number;
  pistonRodIn: number;
  tailRodIn: number;
  clearancePercent: number;
}

export interface IdealCardResult {
  admissionPressurePsia: number;
  backPressurePsia: number;
  cutOffFraction: number;
  clearanceFraction: number;
  /** Ideal MEP ignoring clearance (the basis of the diagram factor), psi. */
  meanEffectivePressurePsi: number;
  /** Ideal MEP with the cylinder's clearance, psi. */
  meanEffectivePressureWithClearancePsi: number;
  /** The ideal card (no clearance) for plotting under the real one, psi gauge. */
  outline: CardOutlinePointDto[];
}
export interface DiagramSteamDto {
  expansionVolumeFt3: number;
  expansionPressurePsia: number;
  compressionVolumeFt3: number;
  compressionPressurePsia: number;
  /** Where the pressure at cut-off came from: the traced card or the logged admission pressure. */
  expansionPressureBasis: 'trace' | 'logged' | 'card';
  steamPerHourLb: number;
  steamPerIhpHourLb: number;
}
export interface CardSetEndResult {
  end: CylinderEnd;
  cardId: string;
  meanEffectivePressurePsi: number;
  effectiveAreaSqIn: number;
  indicatedHorsepower: number;
  ideal: IdealCardResult | null;
  /** Why there is no ideal card, when there is none. */
  idealMissing: string | null;
  diagramFactor: number | null;
  steam: DiagramSteamDto | null;
}
export interface CardSetCylinderResult {
  cylinderId: string;
  label: string;
  role: CylinderRole;
  indicatedHorsepower: number;
  indicatedKilowatts: number;
  /** Share of the engine's indicated work (fraction), only for a complete set (see CardSetResults.workSharesMissing). */
  workShare: number | null;
  admissionPressurePsia: number | null;
  backPressurePsia: number | null;
  ends: CardSetEndResult[];
}
export interface BrakeComparison {
  figureId: string;
  measuredAt: string;
  brakeHorsepower: number;
  /** Fraction (brake ÷ indicated); null for an incomplete set or inputs that give more than 1 (see mechanicalEfficiencyMissing). */
  mechanicalEfficiency: number | null;
  /** Why there is no mechanical efficiency (null when it is given). */
  mechanicalEfficiencyMissing: string | null;
}
export interface CardSetResults {
  speedRpm: number;
  /** Every end of every cylinder has a card. */
  complete: boolean;
  missingEnds: { cylinderId: string; cylinderLabel: string; end: CylinderEnd }[];
  cylinders: CardSetCylinderResult[];
  /** The engine's indicated power for a complete set; for an incomplete one, the sum of the cards present. */
  totalIndicatedHorsepower: number;
  totalIndicatedKilowatts: number;
  /** All the work referred to the largest cylinder, psi (null until every end of every cylinder has a card). */
  referredMeanEffectivePressurePsi: number | null;
  referredToCylinderLabel: string | null;
  /** Why there is no referred MEP (null when it is given). */
  referredMeanEffectivePressureMissing: string | null;
  /** Why the cylinders carry no work share (null when they do). */
  workSharesMissing: string | null;
  receiverPressurePsig: number | null;
  lowPressureAdmissionPsig: number | null;
  /** Receiver pressure less the low-pressure cylinder's admission pressure read off its cards, psi. */
  receiverDropPsi: number | null;
  brake: BrakeComparison | null;
  /** Steam accounted for by the first cylinder's diagrams, lb per indicated horsepower-hour of the engine. */
  steamAccountedForLbPerIhpHour: number | null;
  /** The atmosphere vacuum and gauge readings were turned absolute with, psia. */
  atmosphericPressurePsia: number;
  /** 'barometer': the site's barometer reading; 'standard': no barometer known, the standard atmosphere (see notes). */
  atmosphereBasis: 'barometer' | 'standard';
  /** What could not be worked out, and why. */
  notes: string[];
  computedAt: string;
}

export interface CardSetDto {
  id: string;
  runId: string;
  engineId: string;
  takenAt: string;
  speedRpm: number;
  speedSource: FigureSource;
  speedReadingAt: string | null;
  cutOffPercent: number | null;
  throttlePressurePsig: number | null;
  throttleSource: FigureSource | null;
  receiverPressurePsig: number | null;
  receiverSource: FigureSource | null;
  vacuumInHg: number | null;
  vacuumSource: FigureSource | null;
  /** The site barometer the vacuum and gauge readings were turned absolute with, inHg (null: the standard atmosphere). */
  barometerInHg: number | null;
  barometerSource: FigureSource | null;
  notes: string | null;
  cylinders: CardSetCylinder[];
  cards: CardDto[];
  results: CardSetResults;
  createdBy: string;
  createdByName: string;
  createdAt: string;
  amendments: RecordAmendmentDto[];
}

/** POST /api/runs/:runId/card-sets/preview: what a set would come to, without storing it. */
export interface CardSetPreviewDto {
  speedRpm: number;
  speedSource: FigureSource;
  speedReadingAt: string | null;
  throttlePressurePsig: number | null;
  throttleSource: FigureSource | null;
  receiverPressurePsig: number | null;
  receiverSource: FigureSource | null;
  vacuumInHg: number | null;
  vacuumSource: FigureSource | null;
  barometerInHg: number | null;
  barometerSource: FigureSource | null;
  cylinders: CardSetCylinder[];
  cards: {
    cylinderId: string;
    end: CylinderEnd;
    method: CardMethod;
    meanEffectivePressurePsi: number;
    meanHeightIn: number | null;
    tracedAreaSqIn: number | null;
    outline: CardOutlinePointDto[] | null;
  }[];
  results: CardSetResults;
}

// ---------------------------------------------------------------------------------------------
// Brake (measured output) figures
// ---------------------------------------------------------------------------------------------

export const BRAKE_METHODS = ['direct', 'rope_brake', 'torque'] as const;
export type BrakeMethod = (typeof BRAKE_METHODS)[number];
export const BRAKE_METHOD_LABELS: Record<BrakeMethod, string> = {
  direct: 'Output horsepower measured',
  rope_brake: 'Rope brake',
  torque: 'Torque and speed',
};
export interface BrakeFigureInput {
  measuredAt: string;
  method: BrakeMethod;
  /** direct: the measured output, hp. */
  brakeHorsepower?: number | null;
  /** rope_brake: dead load less spring balance, lbf. */
  netBrakeLoadLbf?: number | null;
  drumDiameterFt?: number | null;
  ropeDiameterFt?: number | null;
  /** torque: shaft torque, lbf·ft. */
  torqueLbfFt?: number | null;
  /** rope_brake and torque: shaft speed, rpm. */
  speedRpm?: number | null;
  note?: string | null;
}
export type AmendBrakeFigureRequest = Partial<BrakeFigureInput> & { reason: string };
export interface BrakeFigureDto {
  id: string;
  runId: string;
  measuredAt: string;
  method: BrakeMethod;
  brakeHorsepower: number;
  brakeKilowatts: number;
  netBrakeLoadLbf: number | null;
  drumDiameterFt: number | null;
  ropeDiameterFt: number | null;
  torqueLbfFt: number | null;
  speedRpm: number | null;
  note: string | null;
  createdBy: string;
  createdByName: string;
  createdAt: string;
  amendments: RecordAmendmentDto[];
}

/** The live event's payload kinds ('run:record' with kind 'card_set' or 'brake_figure'). */
export const CARD_RECORD_KINDS = { cardSet: 'card_set', brakeFigure: 'brake_figure' } as const;

/** POST /api/calculations/indicator-autotrace (raw image body; query lengthIn, springPsiPerIn). */
export interface IndicatorAutotraceResponse {
  /** The proposed trace, image pixels. */
  trace: CardTrace;
  /** Net enclosed area of the diagram, in². */
  areaIn2: number;
  meanEffectivePressurePsi: number;
  /** 0 (nothing to go on) to 1 (a clean card). */
  confidence: number;
  /** Why the confidence is below 1, in words. */
  warnings: string[];
}

/** How a stored trace was made: the proposal accepted as it was, the proposal adjusted, or traced by hand. */
export const TRACE_ORIGINS = ['proposed-accepted', 'adjusted', 'by-hand'] as const;
export type TraceOrigin = (typeof TRACE_ORIGINS)[number];
export const TRACE_ORIGIN_LABELS: Record<TraceOrigin, string> = {
  'proposed-accepted': 'traced automatically, accepted',
  adjusted: 'traced automatically, adjusted',
  'by-hand': 'traced by hand',
};
