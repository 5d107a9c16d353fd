import { create, all } from 'mathjs';
import type { UnitConversion, UnitConversionTable } from '@crankjournal/shared-types';

const math = create(all);
// mathjs knows mmHg but not the inch of mercury; 1 inHg = 25.4 mmHg (conventional, 0 °C).
math.createUnit('inHg', '25.4 mmHg');

/** Stored unit → [mathjs unit, imperial display, metric display]. Gauge and vacuum scales keep their zero. */
const DISPLAY: Record<string, { mathjs: string; imperial: [string, string]; metric: [string, string] }> = {
  psig: { mathjs: 'psi', imperial: ['psig', 'psi'], metric: ['bar', 'bar'] },
  psia: { mathjs: 'psi', imperial: ['psia', 'psi'], metric: ['kPa', 'kPa'] },
  psi: { mathjs: 'psi', imperial: ['psi', 'psi'], metric: ['bar', 'bar'] },
  kPa: { mathjs: 'kPa', imperial: ['psi', 'psi'], metric: ['kPa', 'kPa'] },
  bar: { mathjs: 'bar', imperial: ['psig', 'psi'], metric: ['bar', 'bar'] },
  inHg: { mathjs: 'inHg', imperial: ['inHg', 'inHg'], metric: ['kPa', 'kPa'] },
  degF: { mathjs: 'degF', imperial: ['degF', 'degF'], metric: ['degC', 'degC'] },
  degC: { mathjs: 'degC', imperial: ['degF', 'degF'], metric: ['degC', 'degC'] },
  in: { mathjs: 'inch', imperial: ['in', 'inch'], metric: ['mm', 'mm'] },
  mm: { mathjs: 'mm', imperial: ['in', 'inch'], metric: ['mm', 'mm'] },
  'pint/h': { mathjs: 'pint', imperial: ['pint/h', 'pint'], metric: ['mL/h', 'mL'] },
  'mL/h': { mathjs: 'mL', imperial: ['pint/h', 'pint'], metric: ['mL/h', 'mL'] },
};

let table: UnitConversionTable | null = null;

/** display = stored × factor + offset, computed once from mathjs for every unit we store. */
export function unitConversionTable(): UnitConversionTable {
  if (table) return table;
  const out: UnitConversionTable = { imperial: {}, metric: {} };
  for (const [stored, d] of Object.entries(DISPLAY)) {
    for (const system of ['imperial', 'metric'] as const) {
      const [label, target] = d[system];
      const at = (x: number) => math.unit(x, d.mathjs).toNumber(target);
      const offset = at(0);
      const factor = at(1) - offset;
      out[system][stored] = { from: stored, to: label, factor, offset: Math.abs(offset) < 1e-12 ? 0 : offset };
    }
  }
  return (table = out);
}
