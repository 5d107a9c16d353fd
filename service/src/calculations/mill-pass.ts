/**
 * One rolling pass on the engine-driven mill, checked whole: the stand's load (rolling.ts) and the
 * flywheel's share (flywheel.ts), with the warnings a mill lead acts on. No formula lives here; this
 * composes the two modules, converts the engine's imperial flywheel figures and turns results into warnings.
 *
 *   bar sections may be rectangles (flat, square, box passes), rounds or ovals: areas from sectionAreaMm2,
 *   elongation = entry area / exit area; the roll-gap model (draft, contact length, strain) uses the
 *   section heights and widths as a flat pass (a simplification for grooved passes, with the nominal roll
 *   radius).
 *   warnings: roll force above the stand's maximum separating force; speed after the pass below the set
 *   fraction of rated speed; a stall (the pass needs more than the flywheel holds); no surplus power to
 *   recover the speed.
 */
import {
  passLoad,
  sectionAreaMm2,
  areaElongation,
  MILL_LOAD_CAUTION,
  type BarSection,
  type PassLoadResult,
  type RollForceModel,
  METRES_PER_FOOT,
} from './rolling.js';
import { passFlywheelCheck, flywheelInertiaKgM2, kineticEnergyJ, DEFAULT_MIN_SPEED_FRACTION, type PassFlywheelResult } from './flywheel.js';
import { KG_PER_LB } from './units.js';

export { MILL_LOAD_CAUTION };

export interface MillPassFlywheelInput {
  flywheelMassLb: number;
  flywheelRadiusOfGyrationFt: number;
  /** engine (and flywheel) speed as the bar enters */
  engineSpeedRpm: number;
  ratedSpeedRpm: number;
  /** warn below this fraction of rated speed; default DEFAULT_MIN_SPEED_FRACTION */
  minSpeedFraction?: number;
  /** length of the bar leaving the rolls */
  barExitLengthM: number;
  /** the engine's recent indicated horsepower */
  indicatedHp: number;
  mechanicalEfficiency: number;
  /** load besides the pass (pinion stand, idle stands, shafting), hp */
  baseLoadHp: number;
  creditEngineDuringPass?: boolean;
}

export interface MillPassInput {
  rollDiameterMm: number;
  entry: BarSection;
  exit: BarSection;
  temperatureC: number;
  carbonPct: number;
  rollSpeedRpm: number;
  standMaxForceKn: number;
  frictionFactor?: number;
  meanFlowStressMPa?: number;
  /** roll–stock friction coefficient for the bite check; default HOT_ROLLING_FRICTION_COEFFICIENT (rolling.ts) */
  frictionCoefficient?: number;
  forceModel?: RollForceModel;
  flywheel?: MillPassFlywheelInput | null;
}

export type MillPassWarningCode = 'stand_force' | 'bite' | 'speed_drop' | 'stall' | 'no_surplus_power';
export interface MillPassWarning {
  code: MillPassWarningCode;
  message: string;
}

export interface MillPassFlywheelResult extends PassFlywheelResult {
  massKg: number;
  radiusOfGyrationM: number;
  inertiaKgM2: number;
  startSpeedRpm: number;
  /** kinetic energy at the start speed */
  storedEnergyJ: number;
  indicatedHp: number;
}

export interface MillPassResult {
  load: PassLoadResult;
  entryAreaMm2: number;
  exitAreaMm2: number;
  /** 1 − exit area / entry area */
  areaReduction: number;
  /** entry area / exit area */
  elongation: number;
  /** the flow stress equation was used outside the range it was fitted over (see load.flowStressOutOfRange) */
  flowStressExtrapolated: boolean;
  flywheel: MillPassFlywheelResult | null;
  warnings: MillPassWarning[];
}

/** The stand load, the flywheel's share and the warnings for one pass. Throws RangeError on impossible input. */
export function millPassCheck(input: MillPassInput): MillPassResult {
  const entryAreaMm2 = sectionAreaMm2(input.entry);
  const exitAreaMm2 = sectionAreaMm2(input.exit);
  const elongation = areaElongation(entryAreaMm2, exitAreaMm2);
  // Grooved passes (an oval or a round on either side): the strain is the area reduction's, ln(A0/A1), not the
  // height ratio, which a round-oval-round sequence makes meaningless. Rectangles (flat and box passes) keep ln(h0/h1).
  const grooved = input.entry.shape !== 'rectangle' || input.exit.shape !== 'rectangle';
  const load = passLoad({
    rollDiameterMm: input.rollDiameterMm,
    entryThicknessMm: input.entry.heightMm,
    exitThicknessMm: input.exit.heightMm,
    entryWidthMm: input.entry.widthMm,
    exitWidthMm: input.exit.widthMm,
    temperatureC: input.temperatureC,
    carbonPct: input.carbonPct,
    rollSpeedRpm: input.rollSpeedRpm,
    standMaxForceKn: input.standMaxForceKn,
    frictionFactor: input.frictionFactor,
    meanFlowStressMPa: input.meanFlowStressMPa,
    trueStrain: grooved ? Math.log(elongation) : undefined,
    frictionCoefficient: input.frictionCoefficient,
    forceModel: input.forceModel,
  });
  const warnings: MillPassWarning[] = [];
  if (!load.bites) {
    warnings.push({
      code: 'bite',
      message:
        `The rolls will not bite a ${load.draftMm.toFixed(1)} mm draft: the most they take unaided is μ²·R = ` +
        `${load.maxBiteDraftMm.toFixed(1)} mm at μ = ${load.frictionCoefficient}. Take a lighter draft, or give the friction coefficient ` +
        'if the rolls are ragged.',
    });
  }
  if (load.exceedsStandForce) {
    warnings.push({
      code: 'stand_force',
      message:
        `Roll force ${load.forceKn.toFixed(0)} kN is over the stand's maximum of ${input.standMaxForceKn.toFixed(0)} kN ` +
        `(${(load.standForceUtilisation * 100).toFixed(0)} %). Take a lighter draft or roll hotter.`,
    });
  }
  let flywheel: MillPassFlywheelResult | null = null;
  if (input.flywheel) {
    const f = input.flywheel;
    const massKg = f.flywheelMassLb * KG_PER_LB;
    const radiusOfGyrationM = f.flywheelRadiusOfGyrationFt * METRES_PER_FOOT;
    const inertiaKgM2 = flywheelInertiaKgM2(massKg, radiusOfGyrationM);
    const check = passFlywheelCheck({
      massKg,
      radiusOfGyrationM,
      startSpeedRpm: f.engineSpeedRpm,
      ratedSpeedRpm: f.ratedSpeedRpm,
      minSpeedFraction: f.minSpeedFraction ?? DEFAULT_MIN_SPEED_FRACTION,
      rollPowerW: load.powerRollPairW,
      barExitLengthM: f.barExitLengthM,
      rollSurfaceSpeedMPerS: load.rollSurfaceSpeedMPerS,
      indicatedHp: f.indicatedHp,
      mechanicalEfficiency: f.mechanicalEfficiency,
      baseLoadHp: f.baseLoadHp,
      creditEngineDuringPass: f.creditEngineDuringPass,
    });
    flywheel = {
      ...check,
      massKg,
      radiusOfGyrationM,
      inertiaKgM2,
      startSpeedRpm: f.engineSpeedRpm,
      storedEnergyJ: kineticEnergyJ(inertiaKgM2, f.engineSpeedRpm),
      indicatedHp: f.indicatedHp,
    };
    if (check.stalled) warnings.push({ code: 'stall', message: check.warning ?? 'The engine would stall.' });
    else if (check.belowMinSpeed) warnings.push({ code: 'speed_drop', message: check.warning ?? 'Speed would fall too far.' });
    if (check.recoveryTimeS === null) {
      warnings.push({
        code: 'no_surplus_power',
        message:
          'The engine has no power to spare beyond its base load at this indicated horsepower: it cannot restore the speed between passes.',
      });
    }
  }
  return {
    load: { ...load, elongation },
    entryAreaMm2,
    exitAreaMm2,
    areaReduction: 1 - exitAreaMm2 / entryAreaMm2,
    elongation,
    flowStressExtrapolated: load.flowStressOutOfRange.length > 0,
    flywheel,
    warnings,
  };
}
