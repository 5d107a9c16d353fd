import type { PassCalculationDto, PassWarningCode, SectionDto } from '@crankjournal/shared-types';
import { millPassCheck, type MillPassResult } from '../../calculations/mill-pass.js';
import { MISAKA_VALID_RANGE, TYPICAL_FRICTION_FACTOR } from '../../calculations/rolling.js';
import { WATTS_PER_HP } from '../../calculations/units.js';
import { CalculationInputError } from '../../calculations/errors.js';

const R = MISAKA_VALID_RANGE;
/** The hot flow stress model, named and cited, with the range it was fitted over. */
export const MISAKA_CITATION =
  'Misaka & Yoshimoto (1967), "Formularization of mean resistance to deformation of plain carbon steels at elevated temperature", ' +
  `J. JSTP 8 (79): mean flow stress of plain carbon steel from carbon, temperature, strain and strain rate; fitted over ` +
  `${R.temperatureMinC}–${R.temperatureMaxC} °C, strain rates ${R.strainRateMinPerS}–${R.strainRateMaxPerS} /s, ` +
  `strain ≤ ${R.strainMax}, C ≤ ${R.carbonMaxPct} %.`;
export const GIVEN_FLOW_STRESS_CITATION = 'Mean flow stress given by the user (not calculated).';

/** Everything needed to check one pass, in the units the mill and the engine are described in. */
export interface PassCalculationInput {
  rollDiameterMm: number;
  entry: SectionDto;
  exit: SectionDto;
  temperatureC: number;
  carbonPct: number;
  rollSpeedRpm: number;
  standMaxForceKn: number;
  frictionFactor?: number;
  meanFlowStressMPa?: number;
  frictionCoefficient?: number;
  forceModel?: 'simple' | 'plane_strain';
  flywheel?: {
    flywheelMassLb: number;
    flywheelRadiusOfGyrationFt: number;
    engineSpeedRpm: number;
    startSpeedSource: string;
    ratedSpeedRpm: number;
    minSpeedFraction?: number;
    barExitLengthM: number;
    indicatedHp: number;
    indicatedHpSource: string;
    mechanicalEfficiency: number;
    baseLoadHp: number;
    creditEngineDuringPass?: boolean;
  } | null;
}

const kilo = (j: number) => j / 1000;

/** Runs the pure pass check and shapes its result for the API. Impossible input (exit not thinner…) is a 400. */
export function calculatePass(input: PassCalculationInput): PassCalculationDto {
  const frictionFactor = input.frictionFactor ?? TYPICAL_FRICTION_FACTOR;
  // Impossible input throws CalculationInputError, which the HTTP edge answers as a 400.
  const r: MillPassResult = millPassCheck({ ...input, frictionFactor });
  const l = r.load;
  const f = r.flywheel;
  return {
    entryAreaMm2: r.entryAreaMm2,
    exitAreaMm2: r.exitAreaMm2,
    draftMm: l.draftMm,
    reduction: l.reduction,
    areaReduction: r.areaReduction,
    elongation: r.elongation,
    trueStrain: l.trueStrain,
    contactLengthMm: l.contactLengthMm,
    meanWidthMm: l.meanWidthMm,
    rollSpeedRpm: input.rollSpeedRpm,
    rollSurfaceSpeedMPerS: l.rollSurfaceSpeedMPerS,
    meanStrainRatePerS: l.meanStrainRatePerS,
    flowStress: {
      model: l.flowStressSource,
      citation: l.flowStressSource === 'misaka' ? MISAKA_CITATION : GIVEN_FLOW_STRESS_CITATION,
      meanFlowStressMPa: l.meanFlowStressMPa,
      extrapolated: r.flowStressExtrapolated,
      outOfRange: l.flowStressOutOfRange,
    },
    frictionFactor,
    frictionCoefficient: l.frictionCoefficient,
    maxBiteDraftMm: l.maxBiteDraftMm,
    bites: l.bites,
    forceModel: l.forceModel,
    geometryFactor: l.geometryFactor,
    models: l.models,
    forceKn: l.forceKn,
    forceLbf: l.forceLbf,
    torquePerRollKnM: l.torquePerRollKnM,
    torquePerRollLbfFt: l.torquePerRollLbfFt,
    powerRollPairKw: l.powerRollPairKw,
    powerRollPairHp: l.powerRollPairHp,
    standMaxForceKn: input.standMaxForceKn,
    standForceUtilisation: l.standForceUtilisation,
    exceedsStandForce: l.exceedsStandForce,
    flywheel:
      f && input.flywheel
        ? {
            inertiaKgM2: f.inertiaKgM2,
            storedEnergyKj: kilo(f.storedEnergyJ),
            startSpeedRpm: f.startSpeedRpm,
            endSpeedRpm: f.endSpeedRpm,
            speedDropRpm: f.speedDropRpm,
            minAllowedSpeedRpm: f.minAllowedSpeedRpm,
            belowMinSpeed: f.belowMinSpeed,
            stalled: f.stalled,
            barExitLengthM: input.flywheel.barExitLengthM,
            passDurationS: f.durationS,
            passEnergyKj: kilo(f.passEnergyJ),
            energyFromFlywheelKj: kilo(f.energyFromFlywheelJ),
            indicatedHp: f.indicatedHp,
            indicatedHpSource: input.flywheel.indicatedHpSource,
            startSpeedSource: input.flywheel.startSpeedSource,
            surplusPowerHp: f.surplusPowerW / WATTS_PER_HP,
            recoveryTimeS: f.recoveryTimeS,
          }
        : null,
    warnings: r.warnings.map((w) => ({ code: w.code as PassWarningCode, message: w.message })),
  };
}

/** A calculation's refusal of a pass, in words for the person who typed the sizes (shown beside a schedule's pass). */
export function passErrorMessage(e: CalculationInputError): string {
  return e.advice ?? `The pass cannot be calculated: ${e.message}.`;
}
