import { create, all } from 'mathjs';
import { millPassCheck, type MillPassInput } from './mill-pass.js';
import { passLoad, sectionAreaMm2, areaElongation, barLengthM } from './rolling.js';
import { passFlywheelCheck } from './flywheel.js';
import { KG_PER_LB } from './units.js';

const math = create(all);

describe('bar sections', () => {
  it('rectangle h·w; round π·d²/4; oval as an ellipse π·h·w/4 (plain geometry, checked with mathjs)', () => {
    expect(sectionAreaMm2({ shape: 'rectangle', heightMm: 76.2, widthMm: 76.2 })).toBeCloseTo(
      math.evaluate('(3 in)^2').toNumber('mm^2'),
      9,
    );
    expect(sectionAreaMm2({ shape: 'round', heightMm: 38.1, widthMm: 38.1 })).toBeCloseTo(
      math.evaluate('pi * (1.5 in)^2 / 4').toNumber('mm^2'),
      9,
    );
    expect(sectionAreaMm2({ shape: 'oval', heightMm: 30, widthMm: 60 })).toBeCloseTo(math.evaluate('pi * 15 * 30') as number, 9);
    expect(() => sectionAreaMm2({ shape: 'rectangle', heightMm: 0, widthMm: 10 })).toThrow(RangeError);
  });
  it('elongation is the area ratio and the bar lengthens at constant volume (common practice, no source)', () => {
    // 3 in square billet, 1.5 m long, rolled to 1½ in round: volume is kept, so length × area is the same.
    const stock = sectionAreaMm2({ shape: 'rectangle', heightMm: 76.2, widthMm: 76.2 });
    const round = sectionAreaMm2({ shape: 'round', heightMm: 38.1, widthMm: 38.1 });
    expect(areaElongation(stock, round)).toBeCloseTo((4 / Math.PI) * 4, 9); // (3/1.5)² · 4/π
    expect(barLengthM(1.5, stock, round) * round).toBeCloseTo(1.5 * stock, 6);
    expect(math.evaluate(`${barLengthM(1.5, stock, round)} m`).toNumber('m')).toBeCloseTo(7.639, 3);
  });
  it('1 lb = 0.45359237 kg agrees with mathjs', () => {
    expect(KG_PER_LB).toBeCloseTo(math.unit(1, 'lb').toNumber('kg'), 12);
  });
});

// A three-stand 16 in bar mill behind a 75 rpm engine with a 70-ton flywheel (the invented demo figures).
const engine = {
  flywheelMassLb: 156800,
  flywheelRadiusOfGyrationFt: 9.9,
  engineSpeedRpm: 75,
  ratedSpeedRpm: 75,
  minSpeedFraction: 0.9,
  indicatedHp: 650,
  mechanicalEfficiency: 0.88,
  baseLoadHp: 60,
};
const square = { shape: 'rectangle' as const, heightMm: 76.2, widthMm: 76.2 };
const normal: MillPassInput = {
  rollDiameterMm: 406.4,
  entry: square,
  exit: { shape: 'rectangle', heightMm: 60, widthMm: 82 },
  temperatureC: 1100,
  carbonPct: 0.2,
  rollSpeedRpm: 75,
  standMaxForceKn: 1200,
  frictionFactor: 1.2,
  flywheel: { ...engine, barExitLengthM: barLengthM(1.5, 76.2 * 76.2, 60 * 82) },
};
// A wide flat of medium-carbon steel, rolled cold-ish with a heavy draft and a long bar.
const overloaded: MillPassInput = {
  ...normal,
  entry: { shape: 'rectangle', heightMm: 40, widthMm: 150 },
  exit: { shape: 'rectangle', heightMm: 25, widthMm: 155 },
  temperatureC: 850,
  carbonPct: 0.45,
  flywheel: { ...engine, barExitLengthM: 10 },
};

describe('millPassCheck: the pass as a whole', () => {
  it('composes passLoad and passFlywheelCheck without changing their figures', () => {
    const r = millPassCheck(normal);
    const load = passLoad({
      rollDiameterMm: 406.4,
      entryThicknessMm: 76.2,
      exitThicknessMm: 60,
      entryWidthMm: 76.2,
      exitWidthMm: 82,
      temperatureC: 1100,
      carbonPct: 0.2,
      rollSpeedRpm: 75,
      standMaxForceKn: 1200,
      frictionFactor: 1.2,
    });
    expect(r.load.forceKn).toBe(load.forceKn);
    expect(r.load.powerRollPairW).toBe(load.powerRollPairW);
    const fw = passFlywheelCheck({
      massKg: 156800 * KG_PER_LB,
      radiusOfGyrationM: 9.9 * 0.3048,
      startSpeedRpm: 75,
      ratedSpeedRpm: 75,
      minSpeedFraction: 0.9,
      rollPowerW: load.powerRollPairW,
      barExitLengthM: normal.flywheel!.barExitLengthM,
      rollSurfaceSpeedMPerS: load.rollSurfaceSpeedMPerS,
      indicatedHp: 650,
      mechanicalEfficiency: 0.88,
      baseLoadHp: 60,
    });
    expect(r.flywheel!.endSpeedRpm).toBe(fw.endSpeedRpm);
    expect(r.elongation).toBeCloseTo((76.2 * 76.2) / (60 * 82), 12);
    expect(r.areaReduction).toBeCloseTo(1 - (60 * 82) / (76.2 * 76.2), 12);
  });

  it('stored energy from the engine’s lb and ft figures agrees with mathjs unit arithmetic (E = ½·m·k²·ω²)', () => {
    const r = millPassCheck(normal);
    const e = math.evaluate('0.5 * 156800 lb * (9.9 ft)^2 * (2 pi * 75 / (60 s))^2').toNumber('J');
    expect(r.flywheel!.storedEnergyJ).toBeCloseTo(e, 0);
    // the speed after the pass satisfies the energy balance ½·I·(ω1² − ω2²) = energy drawn
    const drawn = math
      .evaluate(`0.5 * ${r.flywheel!.inertiaKgM2} kg m^2 * ((2 pi * 75 / (60 s))^2 - (2 pi * ${r.flywheel!.endSpeedRpm} / (60 s))^2)`)
      .toNumber('J');
    expect(drawn).toBeCloseTo(r.flywheel!.energyFromFlywheelJ, 3);
  });

  it('a normal hot pass on the 16 in mill is not flagged (stand and speed within limits)', () => {
    const r = millPassCheck(normal);
    expect(r.load.exceedsStandForce).toBe(false);
    expect(r.flywheel!.belowMinSpeed).toBe(false);
    expect(r.warnings).toEqual([]);
    // the slow mill runs below the strain rates the flow stress equation was fitted over: flagged as extrapolated
    expect(r.flowStressExtrapolated).toBe(true);
    expect(r.load.meanStrainRatePerS).toBeLessThan(30);
  });

  it('a heavy pass that overloads the stand and pulls the speed under 90 % of rated is flagged twice', () => {
    const r = millPassCheck(overloaded);
    expect(r.load.forceKn).toBeGreaterThan(1200);
    expect(r.flywheel!.endSpeedRpm).toBeLessThan(0.9 * 75);
    expect(r.warnings.map((w) => w.code)).toEqual(['stand_force', 'speed_drop']);
    expect(r.warnings[0].message).toMatch(/over the stand's maximum of 1200 kN/);
    expect(r.warnings[1].message).toMatch(/below 67\.5 rpm/);
  });

  it('each check flags on its own: a stronger stand clears the force warning but not the speed warning', () => {
    const strongStand = millPassCheck({ ...overloaded, standMaxForceKn: 5000 });
    expect(strongStand.warnings.map((w) => w.code)).toEqual(['speed_drop']);
    const shortBar = millPassCheck({ ...overloaded, flywheel: { ...engine, barExitLengthM: 1 } });
    expect(shortBar.warnings.map((w) => w.code)).toEqual(['stand_force']);
  });

  it('a lower minimum fraction of rated speed moves the speed warning (the setting is honoured)', () => {
    const r = millPassCheck(overloaded);
    const fraction = (r.flywheel!.endSpeedRpm / 75) * 0.99;
    const relaxed = millPassCheck({ ...overloaded, flywheel: { ...engine, barExitLengthM: 10, minSpeedFraction: fraction } });
    expect(relaxed.warnings.map((w) => w.code)).not.toContain('speed_drop');
  });

  it('a stall and an engine with nothing to spare are reported', () => {
    const tiny = millPassCheck({
      ...overloaded,
      flywheel: { ...engine, flywheelMassLb: 2000, flywheelRadiusOfGyrationFt: 2, barExitLengthM: 10 },
    });
    expect(tiny.warnings.map((w) => w.code)).toContain('stall');
    const weak = millPassCheck({ ...normal, flywheel: { ...normal.flywheel!, indicatedHp: 50 } });
    expect(weak.warnings.map((w) => w.code)).toEqual(['no_surplus_power']);
    expect(weak.flywheel!.recoveryTimeS).toBeNull();
  });

  it('without flywheel figures only the stand is checked', () => {
    const r = millPassCheck({ ...overloaded, flywheel: null });
    expect(r.flywheel).toBeNull();
    expect(r.warnings.map((w) => w.code)).toEqual(['stand_force']);
  });

  it('rejects an exit section no thinner than the entry', () => {
    expect(() => millPassCheck({ ...normal, exit: { shape: 'rectangle', heightMm: 80, widthMm: 80 } })).toThrow(RangeError);
  });
});

describe('grooved passes and bite', () => {
  const base = {
    rollDiameterMm: 406.4,
    temperatureC: 1050,
    carbonPct: 0.2,
    rollSpeedRpm: 90,
    standMaxForceKn: 5000,
  };

  it('an oval into a round: the strain is ln(entry area / exit area), not the height ratio', () => {
    const entry = { shape: 'oval' as const, heightMm: 30, widthMm: 60 };
    const exit = { shape: 'round' as const, heightMm: 38, widthMm: 38 };
    const r = millPassCheck({ ...base, entry: { ...entry, heightMm: 60, widthMm: 30 }, exit });
    expect(r.load.trueStrain).toBeCloseTo(Math.log((Math.PI * 60 * 30) / 4 / ((Math.PI * 38 * 38) / 4)), 12);
    expect(r.load.models.strain).toMatch(/area/);
  });

  it('a draft the rolls cannot bite carries a warning with the word "bite"', () => {
    const r = millPassCheck({
      ...base,
      entry: { shape: 'rectangle', heightMm: 60, widthMm: 60 },
      exit: { shape: 'rectangle', heightMm: 45, widthMm: 64 },
      frictionCoefficient: 0.2,
    });
    expect(r.warnings.find((w) => w.code === 'bite')?.message).toMatch(/will not bite a 15\.0 mm draft.*8\.1 mm at μ = 0\.2/);
  });
});
