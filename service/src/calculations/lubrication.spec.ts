import { create, all } from 'mathjs';
import {
  waltherFit,
  waltherViscosityCst,
  kinematicViscosityCst,
  isoVgMidpointCst,
  oilDensityKgM3,
  oilViscosity,
  dynamicViscosityPaS,
  pascalSecondsToReyn,
  PASCAL_SECONDS_PER_REYN,
  bearingUnitLoadPsi,
  petroffTorqueLbfIn,
  petroffFrictionCoefficient,
  sommerfeldNumber,
  torqueLbfInToHp,
  journalFriction,
  liftPressure,
  jackCapacityCheck,
  oilConsumption,
  revolutionsFromSpeed,
  celsiusToKelvin,
  JACKING_CAUTION,
  consumptionTrend,
} from './lubrication.js';

const math = create(all);

describe('ASTM D341 (Walther) viscosity against temperature', () => {
  it('reproduces both data-sheet points it was fitted through', () => {
    // identity of the fit: an error in A or B moves at least one of the two points
    expect(kinematicViscosityCst({ viscosity40cSt: 68, viscosity100cSt: 8.7, temperatureC: 40 })).toBeCloseTo(68, 9);
    expect(kinematicViscosityCst({ viscosity40cSt: 68, viscosity100cSt: 8.7, temperatureC: 100 })).toBeCloseTo(8.7, 9);
  });

  it('matches the constants and the 80 °C value of a published ASTM D341 worked spreadsheet', () => {
    // "Viscosity vs Temperature Calculator", a published ASTM D341 worked spreadsheet (author not shown;
    // seen in an online document library): 32 cSt at 40 °C and 5.4 cSt at 100 °C, kelvin taken as
    // °C + 273, gives A = 9.5259, B = 3.7449 and 8.5 cSt at 80 °C.
    const fit = waltherFit({ temperature1K: 313, viscosity1Cst: 32, temperature2K: 373, viscosity2Cst: 5.4 });
    expect(fit.a).toBeCloseTo(9.5259, 4);
    expect(fit.b).toBeCloseTo(3.7449, 4);
    expect(waltherViscosityCst(fit, 353)).toBeCloseTo(8.5, 1);
  });

  it('predicts a measured mid-temperature viscosity of a heavy machine oil within 3 %', () => {
    // G. W. Stachowiak & A. W. Batchelor, Engineering Tribology (Butterworth-Heinemann), Table 2.3
    // "Dynamic viscosity and pressure-viscosity coefficients of some commonly used lubricants"
    // (edition not confirmed; seen in an online reproduction): heavy machine oil 250, 50.5 and 12.6 mPa·s
    // at 30, 60 and 100 °C. The table gives no density: 880 kg/m³ at 15 °C and 0.00065 /K are assumed
    // (common practice, no source) to pass between dynamic and kinematic viscosity.
    const rho = (c: number) => oilDensityKgM3({ densityKgM3At15C: 880, temperatureC: c });
    const toCst = (mPaS: number, c: number) => (mPaS / 1000 / rho(c)) * 1e6;
    const fit = waltherFit({
      temperature1K: celsiusToKelvin(30),
      viscosity1Cst: toCst(250, 30),
      temperature2K: celsiusToKelvin(100),
      viscosity2Cst: toCst(12.6, 100),
    });
    const predictedMPaS = dynamicViscosityPaS(waltherViscosityCst(fit, celsiusToKelvin(60)), rho(60)) * 1000;
    expect(Math.abs(predictedMPaS / 50.5 - 1)).toBeLessThan(0.03);
  });

  it('viscosity falls as temperature rises and lies between the data-sheet figures at 70 °C', () => {
    const v70 = kinematicViscosityCst({ viscosity40cSt: 68, viscosity100cSt: 8.7, temperatureC: 70 });
    expect(v70).toBeLessThan(68);
    expect(v70).toBeGreaterThan(8.7);
  });
});

describe('ISO 3448 grade mid-point', () => {
  it('VG 68 is 68 cSt at 40 °C with limits ±10 %: 61.2–74.8 cSt (ISO 3448, from memory)', () => {
    const g = isoVgMidpointCst(68);
    expect(g.midpointCst).toBe(68);
    expect(g.minCst).toBeCloseTo(61.2, 9);
    expect(g.maxCst).toBeCloseTo(74.8, 9);
  });
  it('rejects a number that is not a grade', () => {
    expect(() => isoVgMidpointCst(70)).toThrow(RangeError);
  });
});

describe('density and absolute viscosity', () => {
  it('density at 40 °C with the default expansion 0.00065 /K: 880 × (1 − 0.00065 × 25) = 865.7 kg/m³ (common practice, no source)', () => {
    expect(oilDensityKgM3({ densityKgM3At15C: 880, temperatureC: 40 })).toBeCloseTo(865.7, 6);
  });
  it('1 reyn in Pa·s agrees with mathjs lbf·s/in² (6894.757)', () => {
    expect(PASCAL_SECONDS_PER_REYN).toBeCloseTo(math.unit('1 lbf s / in^2').toNumber('Pa s'), 6);
    expect(pascalSecondsToReyn(6894.757293168362)).toBeCloseTo(1, 9);
  });
  it('μ = ν·ρ: 100 cSt at 900 kg/m³ is 0.09 Pa·s, checked with mathjs units', () => {
    const mathjsPaS = math.evaluate('100 mm^2/s * 900 kg/m^3').toNumber('Pa s');
    expect(dynamicViscosityPaS(100, 900)).toBeCloseTo(mathjsPaS, 12);
  });
  it('oilViscosity returns the kinematic, dynamic and reyn figures consistently and flags an assumed density', () => {
    const r = oilViscosity({ viscosity40cSt: 68, viscosity100cSt: 8.7, temperatureC: 60 });
    expect(r.densityAssumed).toBe(true);
    expect(r.dynamicPaS).toBeCloseTo(r.kinematicCst * 1e-6 * r.densityKgM3, 12);
    expect(r.dynamicReyn * PASCAL_SECONDS_PER_REYN).toBeCloseTo(r.dynamicPaS, 12);
    const given = oilViscosity({ viscosity40cSt: 68, viscosity100cSt: 8.7, temperatureC: 60, densityKgM3At15C: 870 });
    expect(given.densityAssumed).toBe(false);
    expect(given.densityKgM3).toBeCloseTo(870 * (1 - 0.00065 * 45), 9);
  });
});

describe('journal bearing: unit load, Sommerfeld number, Petroff', () => {
  // R. L. Mott, Machine Elements in Mechanical Design, chapter on plain surface bearings, worked design
  // example (1500 lb at 850 rpm, D = L = 2.50 in, C_r = 0.0015 in, SAE 30 at 3.3 µreyn), seen in a
  // worked-solutions reproduction: p = 240 psi, S = 0.135, 7.88 lb·in at 850 rpm → 0.106 hp.
  it('unit load on the projected area: 1500 lb on 2.50 × 2.50 in = 240 psi (Mott)', () => {
    expect(bearingUnitLoadPsi(1500, 2.5, 2.5)).toBeCloseTo(240, 9);
  });
  it('Sommerfeld number S = (r/c)²·μN/P = 0.135 (Mott)', () => {
    const s = sommerfeldNumber({
      radiusIn: 1.25,
      radialClearanceIn: 0.0015,
      viscosityReyn: 3.3e-6,
      speedRevPerS: 850 / 60,
      unitLoadPsi: 240,
    });
    expect(s).toBeCloseTo(0.135, 3);
  });
  it('friction power from torque: 7.88 lb·in at 850 rpm = 0.106 hp (Mott)', () => {
    expect(torqueLbfInToHp(7.88, 850)).toBeCloseTo(0.106, 3);
  });

  // Centrifugal-pump design text, hydrodynamic bearings chapter, "evaluation of frictional losses"
  // (book attributed from memory to V. S. Lobanoff & R. R. Ross, Centrifugal Pumps: Design and Application,
  // 2nd ed.; seen in an online reproduction of the chapter):
  // D = 5 in, L = 5 in, c = 0.0025 in, 5000 rpm, μ = 2 × 10⁻⁶ lb·s/in² → 16.32 hp.
  const pumpExample = {
    diameterIn: 5,
    lengthIn: 5,
    radialClearanceIn: 0.0025,
    speedRpm: 5000,
    viscosityReyn: 2e-6,
    loadLbf: 1000,
  };
  it('Petroff power loss of the centrifugal-pump bearing example is 16.32 hp', () => {
    expect(journalFriction(pumpExample).powerLossHp).toBeCloseTo(16.32, 1);
  });
  it('Petroff torque agrees with the same formula evaluated in mathjs units (lbf·in and hp)', () => {
    const scope = {
      mu: math.unit('2e-6 lbf s / in^2'),
      n: math.unit(5000 / 60, 'Hz'),
      r: math.unit('2.5 in'),
      l: math.unit('5 in'),
      c: math.unit('0.0025 in'),
    };
    const torque = math.evaluate('4 * pi^2 * mu * n * r^3 * l / c', scope);
    const r = journalFriction(pumpExample);
    expect(r.frictionTorqueLbfIn).toBeCloseTo(torque.toNumber('lbf in'), 6);
    const power = math.evaluate('t * 2 * pi * n', { t: torque, n: scope.n });
    expect(r.powerLossHp).toBeCloseTo(power.toNumber('hp'), 6);
  });
  it(
    'Petroff identities: f·(r/c) = 2π²·S and T = f·W·r (Shigley, Mechanical Engineering Design, Petroff\u2019s ' + 'equation, from memory)',
    () => {
      const r = journalFriction({ ...pumpExample, loadLbf: 2500 });
      expect(r.frictionCoefficient * (2.5 / 0.0025)).toBeCloseTo(2 * Math.PI ** 2 * r.sommerfeldNumber, 9);
      expect(r.frictionCoefficient * 2500 * 2.5).toBeCloseTo(r.frictionTorqueLbfIn, 6);
      expect(r.unitLoadPsi).toBeCloseTo(2500 / 25, 9);
    },
  );
  it('the individual Petroff pieces match journalFriction', () => {
    const t = petroffTorqueLbfIn({ radiusIn: 8, lengthIn: 26, radialClearanceIn: 0.008, viscosityReyn: 5e-6, speedRevPerS: 75 / 60 });
    const r = journalFriction({
      diameterIn: 16,
      lengthIn: 26,
      radialClearanceIn: 0.008,
      speedRpm: 75,
      viscosityReyn: 5e-6,
      loadLbf: 60000,
    });
    expect(r.frictionTorqueLbfIn).toBeCloseTo(t, 9);
    const f = petroffFrictionCoefficient({
      radiusIn: 8,
      radialClearanceIn: 0.008,
      viscosityReyn: 5e-6,
      speedRevPerS: 1.25,
      unitLoadPsi: r.unitLoadPsi,
    });
    expect(r.frictionCoefficient).toBeCloseTo(f, 12);
  });
  it('Petroff friction coefficient of a published calculator example: 1 Pa\u00b7s, 10 rev/s, 0.15 MPa, c/r = 0.005 \u2192 0.263189', () => {
    // "Petroff's equation for coefficient of friction" calculator, calculatoratoz.com, worked example on the page
    // (online calculator, seen 2026): f = 2\u03c0\u00b2\u00b7(\u03bcN/P)\u00b7(r/c) with \u03bc = 10 P = 1 Pa\u00b7s,
    // N = 10 rev/s, P = 0.15 MPa and relative clearance 0.005 gives 0.263189450695716. Our function takes reyn and psi;
    // \u03bcN/P is dimensionless, so the SI figures are converted to reyn and psi with the same factor.
    const f = petroffFrictionCoefficient({
      radiusIn: 1,
      radialClearanceIn: 0.005,
      viscosityReyn: 1 / PASCAL_SECONDS_PER_REYN,
      speedRevPerS: 10,
      unitLoadPsi: 150000 / PASCAL_SECONDS_PER_REYN,
    });
    expect(f).toBeCloseTo(0.263189450695716, 9);
  });
  it('rejects a zero clearance', () => {
    expect(() => journalFriction({ ...pumpExample, radialClearanceIn: 0 })).toThrow(RangeError);
  });
});

describe('jacking and lift pressure (common practice, no source)', () => {
  it('lift pressure is load over pocket area; the pump figure applies the breakaway factor', () => {
    const r = liftPressure({ loadLbf: 112500, pocketAreaIn2: 75 });
    expect(r.liftPressurePsi).toBeCloseTo(1500, 9);
    expect(r.pumpPressurePsi).toBeCloseTo(3000, 9);
    expect(r.pumpPressureRangePsi.min).toBeCloseTo(2250, 9);
    expect(r.pumpPressureRangePsi.max).toBeCloseTo(4500, 9);
    expect(() => liftPressure({ loadLbf: 1000, pocketAreaIn2: 10, breakawayFactor: 0.5 })).toThrow(RangeError);
  });
  it('four 50-short-ton jacks under 225,000 lb: 200 t capacity, 112.5 t load, margin ≈ 1.78', () => {
    const r = jackCapacityCheck({ jackCount: 4, jackCapacityShortTons: 50, loadLbf: 225000 });
    expect(r.capacityShortTons).toBe(200);
    expect(r.loadShortTons).toBeCloseTo(112.5, 9);
    expect(r.margin).toBeCloseTo(1.78, 2);
    expect(r.belowRequiredMargin).toBe(false);
    expect(jackCapacityCheck({ jackCount: 4, jackCapacityShortTons: 50, loadLbf: 225000, requiredMargin: 2 }).belowRequiredMargin).toBe(
      true,
    );
    expect(jackCapacityCheck({ jackCount: 3, jackCapacityShortTons: 50, loadLbf: 225000 }).belowRequiredMargin).toBe(true);
  });
  it('exports a jacking caution that defers to codes and licensed practice', () => {
    expect(JACKING_CAUTION).toMatch(/qualified crew/);
    expect(JACKING_CAUTION).toMatch(/licensed practice/);
  });
});

describe('oil consumption (common practice, no source)', () => {
  it('3 L over 4 h at 75 rpm is 0.75 L per run-hour and 0.1667 L per thousand revolutions', () => {
    const revolutions = revolutionsFromSpeed(75, 4);
    expect(revolutions).toBe(18000);
    const r = oilConsumption({ oilUsedLitres: 3, runHours: 4, revolutions });
    expect(r.litresPerRunHour).toBeCloseTo(0.75, 12);
    expect(r.litresPerThousandRevolutions).toBeCloseTo(3 / 18, 12);
  });
});

describe('consumption trend (common practice, no source: latest against the median of the earlier runs, \u00b115 % steady)', () => {
  it('0.20 after 0.10, 0.12, 0.11 (median 0.11) is a rise of about 81.8 %, checked with mathjs', () => {
    const r = consumptionTrend([0.1, 0.12, 0.11, 0.2]);
    const median = Number(math.median([0.1, 0.12, 0.11]));
    expect(r.earlierMedian).toBeCloseTo(median, 12);
    expect(r.changePercent).toBeCloseTo(((0.2 - median) / median) * 100, 9);
    expect(r.direction).toBe('rising');
  });
  it('one odd earlier run does not make a normal latest run look falling (median of an even count checked with mathjs)', () => {
    const r = consumptionTrend([0.071, 0.07, 0.069, 0.145, 0.07, 0.07]);
    expect(r.earlierMedian).toBeCloseTo(Number(math.median([0.071, 0.07, 0.069, 0.145, 0.07])), 12);
    expect(r.direction).toBe('steady');
    expect(consumptionTrend([0.07, 0.07, 0.145, 0.07]).earlierMedian).toBeCloseTo(Number(math.median([0.07, 0.07, 0.145])), 12);
  });
  it('within 15 % is steady, below is falling; one run has no trend', () => {
    expect(consumptionTrend([0.1, 0.1, 0.11]).direction).toBe('steady');
    expect(consumptionTrend([0.1, 0.1, 0.05]).direction).toBe('falling');
    expect(consumptionTrend([0.1]).direction).toBeNull();
    expect(consumptionTrend([]).latest).toBeNull();
  });
  it('the steady band is a setting', () => {
    expect(consumptionTrend([0.1, 0.1, 0.11], { steadyPercent: 5 }).direction).toBe('rising');
  });
});
