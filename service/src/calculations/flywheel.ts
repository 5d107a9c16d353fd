/**
 * Flywheel: stored energy, speed fluctuation, the speed drop over a rolling pass and the time the engine
 * needs to restore it.
 *
 *   I = m·k², E = ½·I·ω², ω = 2πN/60
 *   energy fluctuation ΔE = m·k²·ω²·Cs, with Cs = (N1 − N2)/N the coefficient of fluctuation of speed
 *   speed after drawing ΔE from N1: N2 = √(N1² − 2ΔE / (I·(2π/60)²))
 *   pass energy = roll power × pass duration, duration = bar exit length / roll surface speed
 *   recovery time = energy to restore / surplus power, surplus = indicated hp × mechanical efficiency − base load
 *
 * SI throughout (kg, m, J, W); speeds in rpm.
 */
import { WATTS_PER_HP } from './units.js';
import { assertFinite, assertPositive, assertNonNegative } from './input-checks.js';
import { CalculationInputError } from './errors.js';

/** Lowest speed after a pass, as a fraction of rated speed, before a warning (common practice, no source; set per engine). */
export const DEFAULT_MIN_SPEED_FRACTION = 0.9;

export function rpmToRadPerS(speedRpm: number): number {
  return (2 * Math.PI * speedRpm) / 60;
}
export function radPerSToRpm(angularSpeedRadPerS: number): number {
  return (angularSpeedRadPerS * 60) / (2 * Math.PI);
}

/** Moment of inertia I = m·k², kg·m². */
export function flywheelInertiaKgM2(massKg: number, radiusOfGyrationM: number): number {
  assertPositive('massKg', massKg);
  assertPositive('radiusOfGyrationM', radiusOfGyrationM);
  return massKg * radiusOfGyrationM ** 2;
}

/** Kinetic energy E = ½·I·ω², J. */
export function kineticEnergyJ(inertiaKgM2: number, speedRpm: number): number {
  assertPositive('inertiaKgM2', inertiaKgM2);
  assertNonNegative('speedRpm', speedRpm);
  return 0.5 * inertiaKgM2 * rpmToRadPerS(speedRpm) ** 2;
}

/** Speed (rpm) at which a flywheel of inertia I holds kinetic energy E (inverse of kineticEnergyJ). */
export function speedForEnergyRpm(inertiaKgM2: number, energyJ: number): number {
  assertPositive('inertiaKgM2', inertiaKgM2);
  assertNonNegative('energyJ', energyJ);
  return radPerSToRpm(Math.sqrt((2 * energyJ) / inertiaKgM2));
}

/** Maximum fluctuation of energy ΔE = I·ω²·Cs (= m·k²·ω²·Cs), J. */
export function energyFluctuationJ(p: { inertiaKgM2: number; meanSpeedRpm: number; coefficientOfFluctuation: number }): number {
  assertPositive('inertiaKgM2', p.inertiaKgM2);
  assertPositive('meanSpeedRpm', p.meanSpeedRpm);
  assertNonNegative('coefficientOfFluctuation', p.coefficientOfFluctuation);
  return p.inertiaKgM2 * rpmToRadPerS(p.meanSpeedRpm) ** 2 * p.coefficientOfFluctuation;
}

/** Maximum and minimum speeds about a mean speed for a given energy fluctuation (ΔE = I·ω²·Cs solved for Cs). */
export function speedLimitsFromFluctuation(p: { inertiaKgM2: number; meanSpeedRpm: number; energyFluctuationJ: number }): {
  coefficientOfFluctuation: number;
  maxSpeedRpm: number;
  minSpeedRpm: number;
} {
  const perUnitCs = energyFluctuationJ({ inertiaKgM2: p.inertiaKgM2, meanSpeedRpm: p.meanSpeedRpm, coefficientOfFluctuation: 1 });
  assertNonNegative('energyFluctuationJ', p.energyFluctuationJ);
  const coefficientOfFluctuation = p.energyFluctuationJ / perUnitCs;
  return {
    coefficientOfFluctuation,
    maxSpeedRpm: p.meanSpeedRpm * (1 + coefficientOfFluctuation / 2),
    minSpeedRpm: p.meanSpeedRpm * (1 - coefficientOfFluctuation / 2),
  };
}

export interface SpeedAfterDraw {
  endSpeedRpm: number;
  speedDropRpm: number;
  /** true when the energy drawn exceeds what the flywheel holds at the start speed */
  stalled: boolean;
}

/** Speed after drawing energyJ from a flywheel turning at startSpeedRpm: N2 = √(N1² − 2ΔE/(I·(2π/60)²)). */
export function speedAfterEnergyDraw(p: { inertiaKgM2: number; startSpeedRpm: number; energyJ: number }): SpeedAfterDraw {
  assertNonNegative('energyJ', p.energyJ);
  const remainingJ = kineticEnergyJ(p.inertiaKgM2, p.startSpeedRpm) - p.energyJ;
  const stalled = remainingJ <= 0;
  const endSpeedRpm = stalled ? 0 : speedForEnergyRpm(p.inertiaKgM2, remainingJ);
  return { endSpeedRpm, speedDropRpm: p.startSpeedRpm - endSpeedRpm, stalled };
}

/** Time the bar is in the rolls: bar exit length / roll surface speed, s. */
export function passDurationS(barExitLengthM: number, rollSurfaceSpeedMPerS: number): number {
  assertPositive('barExitLengthM', barExitLengthM);
  assertPositive('rollSurfaceSpeedMPerS', rollSurfaceSpeedMPerS);
  return barExitLengthM / rollSurfaceSpeedMPerS;
}

/** Energy taken by a pass: roll power × duration, J. */
export function passEnergyJ(rollPowerW: number, durationS: number): number {
  assertNonNegative('rollPowerW', rollPowerW);
  assertNonNegative('durationS', durationS);
  return rollPowerW * durationS;
}

/** Power the engine has to spare: indicated hp × mechanical efficiency − base load (hp), in W. */
export function surplusPowerW(p: { indicatedHp: number; mechanicalEfficiency: number; baseLoadHp: number }): number {
  assertNonNegative('indicatedHp', p.indicatedHp);
  assertNonNegative('baseLoadHp', p.baseLoadHp);
  assertFinite('mechanicalEfficiency', p.mechanicalEfficiency);
  if (p.mechanicalEfficiency <= 0 || p.mechanicalEfficiency > 1)
    throw new CalculationInputError(null, 'mechanicalEfficiency must be in (0, 1]');
  return (p.indicatedHp * p.mechanicalEfficiency - p.baseLoadHp) * WATTS_PER_HP;
}

/** Time to restore energyJ to the flywheel from the surplus power; null when there is no surplus. */
export function recoveryTimeS(energyJ: number, surplusW: number): number | null {
  assertNonNegative('energyJ', energyJ);
  assertFinite('surplusW', surplusW);
  if (surplusW <= 0) return null;
  return energyJ / surplusW;
}

export interface PassFlywheelInput {
  massKg: number;
  radiusOfGyrationM: number;
  startSpeedRpm: number;
  ratedSpeedRpm: number;
  /** default DEFAULT_MIN_SPEED_FRACTION */
  minSpeedFraction?: number;
  rollPowerW: number;
  barExitLengthM: number;
  rollSurfaceSpeedMPerS: number;
  /** recent indicated horsepower of the engine */
  indicatedHp: number;
  mechanicalEfficiency: number;
  /** load the engine carries besides the pass (friction of line shafting, idle stands), hp */
  baseLoadHp: number;
  /**
   * Credit the engine's surplus power during the pass, so the flywheel supplies only the shortfall.
   * Default false: the flywheel is assumed to supply the whole pass (the conservative case).
   */
  creditEngineDuringPass?: boolean;
}

export interface PassFlywheelResult extends SpeedAfterDraw {
  durationS: number;
  passEnergyJ: number;
  energyFromFlywheelJ: number;
  surplusPowerW: number;
  recoveryTimeS: number | null;
  minAllowedSpeedRpm: number;
  belowMinSpeed: boolean;
  warning: string | null;
}

/** Can the flywheel carry a pass? Speed after the pass, recovery time and a warning. */
export function passFlywheelCheck(p: PassFlywheelInput): PassFlywheelResult {
  assertPositive('ratedSpeedRpm', p.ratedSpeedRpm);
  const minSpeedFraction = p.minSpeedFraction ?? DEFAULT_MIN_SPEED_FRACTION;
  if (!(minSpeedFraction > 0 && minSpeedFraction <= 1)) throw new CalculationInputError(null, 'minSpeedFraction must be in (0, 1]');
  const inertia = flywheelInertiaKgM2(p.massKg, p.radiusOfGyrationM);
  const durationS = passDurationS(p.barExitLengthM, p.rollSurfaceSpeedMPerS);
  const energyJ = passEnergyJ(p.rollPowerW, durationS);
  const surplusW = surplusPowerW(p);
  const creditJ = p.creditEngineDuringPass && surplusW > 0 ? surplusW * durationS : 0;
  const energyFromFlywheelJ = Math.max(0, energyJ - creditJ);
  const after = speedAfterEnergyDraw({ inertiaKgM2: inertia, startSpeedRpm: p.startSpeedRpm, energyJ: energyFromFlywheelJ });
  const minAllowedSpeedRpm = minSpeedFraction * p.ratedSpeedRpm;
  const belowMinSpeed = after.endSpeedRpm < minAllowedSpeedRpm;
  let warning: string | null = null;
  if (after.stalled) {
    warning = 'The pass needs more energy than the flywheel holds: the engine would stall.';
  } else if (belowMinSpeed) {
    warning =
      `Speed would fall to ${after.endSpeedRpm.toFixed(1)} rpm, below ${minAllowedSpeedRpm.toFixed(1)} rpm ` +
      `(${Math.round(minSpeedFraction * 100)} % of rated). Take a lighter draft or wait for full speed.`;
  }
  return {
    ...after,
    durationS,
    passEnergyJ: energyJ,
    energyFromFlywheelJ,
    surplusPowerW: surplusW,
    recoveryTimeS: recoveryTimeS(energyFromFlywheelJ, surplusW),
    minAllowedSpeedRpm,
    belowMinSpeed,
    warning,
  };
}
