import { create, all } from 'mathjs';
import { CalculationInputError } from './errors.js';
import {
  FT3_PER_LB_PER_M3_PER_KG,
  cylinderVolumeFt3,
  region2SpecificVolumeM3PerKg,
  saturatedVapourSpecificVolumeFt3PerLb,
  saturatedVapourSpecificVolumeM3PerKg,
  saturationPressureMPa,
  saturationPressurePsiaFromF,
  saturationTemperatureFFromPsia,
  saturationTemperatureK,
  steamAccountedForByDiagram,
  steamAccountedForFromSpecificVolumes,
} from './steam-if97.js';

const math = create(all);
const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('IF97 region 4, saturation line', () => {
  // IAPWS R7-97(2012), Table 36: saturation temperatures calculated from eq. 31 (computer-program verification).
  it.each([
    [0.1, 372.755919],
    [1, 453.035632],
    [10, 584.149488],
  ])('saturation temperature at %p MPa is %p K (IAPWS R7-97(2012), Table 36)', (pMPa, tK) => {
    expect(saturationTemperatureK(pMPa)).toBeCloseTo(tK, 5);
  });

  // IAPWS R7-97(2012), Table 35: saturation pressures calculated from eq. 30 (computer-program verification).
  it.each([
    [300, 0.353658941e-2],
    [500, 0.263889776e1],
    [600, 0.123443146e2],
  ])('saturation pressure at %p K is %p MPa (IAPWS R7-97(2012), Table 35)', (tK, pMPa) => {
    expect(relativeError(saturationPressureMPa(tK), pMPa)).toBeLessThan(1e-8);
  });

  it('eq. 30 and eq. 31 invert each other across the range (IAPWS R7-97(2012), section 8.1: consistent to 1e-5 K)', () => {
    for (let t = 275; t <= 645; t += 10) {
      expect(saturationTemperatureK(saturationPressureMPa(t))).toBeCloseTo(t, 5);
    }
  });

  it('water boils at 212 °F under one standard atmosphere, 14.7 psia (common practice, no source)', () => {
    // On the ITS-90 temperature scale the normal boiling point is 99.97 °C (211.95 °F), from memory,
    // so the trade's round figures hold to a tenth of a degree and a few hundredths of a psi.
    expect(Math.abs(saturationTemperatureFFromPsia(14.696) - 212)).toBeLessThan(0.1);
    expect(Math.abs(saturationPressurePsiaFromF(212) - 14.696)).toBeLessThan(0.02);
  });

  it('refuses pressures and temperatures off the saturation line', () => {
    expect(() => saturationTemperatureK(25)).toThrow(RangeError);
    expect(() => saturationTemperatureK(0)).toThrow(RangeError);
    expect(() => saturationPressureMPa(700)).toThrow(RangeError);
    expect(() => saturationPressureMPa(250)).toThrow(RangeError);
  });
});

describe('IF97 region 2, specific volume', () => {
  // IAPWS R7-97(2012), Table 15: verification values for eq. 15.
  it.each([
    [300, 0.0035, 0.394913866e2],
    [700, 0.0035, 0.923015898e2],
    [700, 30, 0.542946619e-2],
  ])('v(T = %p K, p = %p MPa) = %p m³/kg (IAPWS R7-97(2012), Table 15)', (tK, pMPa, v) => {
    expect(relativeError(region2SpecificVolumeM3PerKg(tK, pMPa), v)).toBeLessThan(1e-8);
  });

  // G. F. C. Rogers & Y. R. Mayhew, Thermodynamic and Transport Properties of Fluids (SI units), 5th ed.,
  // saturated water and steam table (from memory): v_g 12.03 m³/kg at 50 °C, 2.361 m³/kg at 90 °C.
  it.each([
    [50, 12.03],
    [90, 2.361],
  ])('dry saturated vapour at %p °C has v_g ≈ %p m³/kg (Rogers & Mayhew steam tables, 5th ed.)', (tC, vg) => {
    const pMPa = saturationPressureMPa(tC + 273.15);
    expect(relativeError(saturatedVapourSpecificVolumeM3PerKg(pMPa), vg)).toBeLessThan(1e-3);
  });

  it('1 m³/kg in ft³/lb agrees with mathjs (registry reference library)', () => {
    const viaMathjs = math.unit(1, 'm^3/kg').toNumber('ft^3/lb');
    expect(relativeError(FT3_PER_LB_PER_M3_PER_KG, viaMathjs)).toBeLessThan(1e-12);
  });

  it('v_g in ft³/lb is the SI value converted with mathjs', () => {
    const pPsia = 100;
    const pMPa = math.unit(pPsia, 'psi').toNumber('MPa');
    const viaSi = math.unit(saturatedVapourSpecificVolumeM3PerKg(pMPa), 'm^3/kg').toNumber('ft^3/lb');
    expect(relativeError(saturatedVapourSpecificVolumeFt3PerLb(pPsia), viaSi)).toBeLessThan(1e-9);
  });

  it('refuses saturated vapour above 623.15 K, where region 3 begins', () => {
    expect(() => saturatedVapourSpecificVolumeM3PerKg(20)).toThrow(RangeError);
  });
});

describe('steam accounted for by the indicator diagram', () => {
  // Machinery's Reference Series No. 70, "Steam Engines" (Industrial Press; public-domain eBook,
  // transcribed online), section on steam consumption from the indicator diagram, Fig. 53 example:
  // head-end piston 201 in² (1.4 ft²), point C on the expansion line at 2.27 ft from the clearance
  // line, point Q on the compression line at 0.30 ft, both at 48.6 psia; "a cubic foot of steam at
  // 48.6 pounds absolute pressure … 0.116 pound"; 150 rpm, 217 IHP → 0.32 lb per stroke,
  // 18,000 strokes per hour, 5760 lb, 26.5 lb per indicated horsepower per hour.
  const example = {
    expansionVolumeFt3: 1.4 * 2.27,
    compressionVolumeFt3: 1.4 * 0.3,
    speedRpm: 150,
    strokesPerRevolution: 2,
    indicatedHorsepower: 217,
  };

  it('reproduces the book with its own steam-table density (Machinery’s Reference Series No. 70, Fig. 53 example)', () => {
    const result = steamAccountedForFromSpecificVolumes({
      ...example,
      expansionSpecificVolumeFt3PerLb: 1 / 0.116,
      compressionSpecificVolumeFt3PerLb: 1 / 0.116,
    });
    expect(result.steamPerStrokeLb).toBeCloseTo(0.32, 2);
    expect(result.steamPerHourLb).toBeCloseTo(5760, -1);
    expect(result.steamPerIhpHourLb).toBeCloseTo(26.5, 1);
  });

  it('with IF97 densities lands within 2 % of the book, whose steam table predates IF97 (same example)', () => {
    const result = steamAccountedForByDiagram({
      ...example,
      expansionPressurePsia: 48.6,
      compressionPressurePsia: 48.6,
    });
    expect(relativeError(1 / result.expansionSpecificVolumeFt3PerLb, 0.116)).toBeLessThan(0.02);
    expect(relativeError(result.steamPerIhpHourLb, 26.5)).toBeLessThan(0.02);
  });

  it('cylinder volume: 201 in² piston, 30 in stroke, point at 2.27 ft of 2.49 ft incl. 6 % clearance ≈ 3.18 ft³ (same example)', () => {
    // NX = 2.49 ft is the stroke on the book's scale; ON = 0.06·NX is the clearance; OF = 2.27 ft.
    const clearanceFraction = 0.06;
    const strokeFraction = 2.27 / 2.49 - clearanceFraction;
    expect(cylinderVolumeFt3({ effectiveAreaSqIn: 201, strokeIn: 30, strokeFraction, clearanceFraction })).toBeCloseTo(3.18, 1);
  });

  it('refuses a zero horsepower or speed', () => {
    expect(() =>
      steamAccountedForByDiagram({ ...example, expansionPressurePsia: 48.6, compressionPressurePsia: 48.6, indicatedHorsepower: 0 }),
    ).toThrow(RangeError);
    expect(() =>
      steamAccountedForByDiagram({ ...example, expansionPressurePsia: 48.6, compressionPressurePsia: 48.6, speedRpm: -1 }),
    ).toThrow(RangeError);
  });

  it('refuses steam accounted for that comes out negative (expansion pressure below compression pressure)', () => {
    const negative = () => steamAccountedForByDiagram({ ...example, expansionPressurePsia: 10, compressionPressurePsia: 100 });
    expect(negative).toThrow(CalculationInputError);
    expect(negative).toThrow(/comes out negative: the expansion pressure \(10\.0 psia\) is below the compression pressure \(100\.0 psia\)/);
    expect(() =>
      steamAccountedForFromSpecificVolumes({ ...example, expansionSpecificVolumeFt3PerLb: 40, compressionSpecificVolumeFt3PerLb: 4 }),
    ).toThrow(/comes out negative/);
  });
});
