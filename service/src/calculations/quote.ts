import { assertFinite, assertNonNegative } from './input-checks.js';
import { CalculationInputError } from './errors.js';
/**
 * Quote for a customer lot rolled on the mill.
 *
 *   stock needed (t) = product (t) / (1 − yield loss fraction)   (scale, crop ends and rejects are lost)
 *   lines: stock (t × rate per t), engine hours × rate, crew hours × crew size × rate per person-hour,
 *          fixed costs
 *   subtotal = sum of lines
 *   contingency = subtotal × contingency %
 *   margin = (subtotal + contingency) × margin %
 *   total = subtotal + contingency + margin
 *
 * Money is carried unrounded through the arithmetic and rounded to cents only at the end: every amount
 * shown is the exact figure rounded, and the total is the exact total rounded, so the rounded lines can
 * differ from the total by a cent.
 */

export interface QuoteLine {
  label: string;
  quantity: number;
  unit: string;
  rate: number;
  amount: number;
}

export interface QuoteInput {
  productTonnes: number;
  /** fraction of the stock weight lost, 0 ≤ f < 1 */
  yieldLossFraction: number;
  stockRatePerTonne: number;
  engineHours: number;
  engineRatePerHour: number;
  crewHours: number;
  crewSize: number;
  crewRatePerPersonHour: number;
  fixedCosts?: { label: string; amount: number }[];
  contingencyPct?: number;
  marginPct?: number;
}

export interface Quote {
  stockTonnes: number;
  lines: QuoteLine[];
  subtotal: number;
  contingency: QuoteLine;
  margin: QuoteLine;
  total: number;
}

/** Round money to cents, half away from zero, guarding against binary representation (1.005 → 1.01). */
export function roundToCents(amount: number): number {
  assertFinite('amount', amount);
  const sign = amount < 0 ? -1 : 1;
  const cents = Math.round(Number((Math.abs(amount) * 100).toPrecision(15)));
  return (sign * cents) / 100;
}

/** Stock weight needed for a product weight after the yield loss. */
export function stockTonnesRequired(productTonnes: number, yieldLossFraction: number): number {
  assertNonNegative('productTonnes', productTonnes);
  assertFinite('yieldLossFraction', yieldLossFraction);
  if (yieldLossFraction < 0 || yieldLossFraction >= 1) throw new CalculationInputError(null, 'yieldLossFraction must be in [0, 1)');
  return productTonnes / (1 - yieldLossFraction);
}

export function buildQuote(input: QuoteInput): Quote {
  for (const [name, value] of Object.entries({
    stockRatePerTonne: input.stockRatePerTonne,
    engineHours: input.engineHours,
    engineRatePerHour: input.engineRatePerHour,
    crewHours: input.crewHours,
    crewSize: input.crewSize,
    crewRatePerPersonHour: input.crewRatePerPersonHour,
  })) {
    assertNonNegative(name, value);
  }
  const contingencyPct = input.contingencyPct ?? 0;
  const marginPct = input.marginPct ?? 0;
  assertNonNegative('contingencyPct', contingencyPct);
  assertNonNegative('marginPct', marginPct);

  const stockTonnes = stockTonnesRequired(input.productTonnes, input.yieldLossFraction);
  const exact: QuoteLine[] = [
    { label: 'Stock', quantity: stockTonnes, unit: 't', rate: input.stockRatePerTonne, amount: stockTonnes * input.stockRatePerTonne },
    {
      label: 'Engine time',
      quantity: input.engineHours,
      unit: 'h',
      rate: input.engineRatePerHour,
      amount: input.engineHours * input.engineRatePerHour,
    },
    {
      label: `Crew (${input.crewSize})`,
      quantity: input.crewHours * input.crewSize,
      unit: 'person-h',
      rate: input.crewRatePerPersonHour,
      amount: input.crewHours * input.crewSize * input.crewRatePerPersonHour,
    },
  ];
  for (const f of input.fixedCosts ?? []) {
    assertNonNegative(`fixed cost "${f.label}"`, f.amount);
    exact.push({ label: f.label, quantity: 1, unit: 'item', rate: f.amount, amount: f.amount });
  }
  const subtotal = exact.reduce((s, l) => s + l.amount, 0);
  const contingency = (subtotal * contingencyPct) / 100;
  const margin = ((subtotal + contingency) * marginPct) / 100;
  const total = subtotal + contingency + margin;

  return {
    stockTonnes,
    lines: exact.map((l) => ({ ...l, amount: roundToCents(l.amount) })),
    subtotal: roundToCents(subtotal),
    contingency: {
      label: 'Contingency',
      quantity: contingencyPct,
      unit: '%',
      rate: roundToCents(subtotal),
      amount: roundToCents(contingency),
    },
    margin: { label: 'Margin', quantity: marginPct, unit: '%', rate: roundToCents(subtotal + contingency), amount: roundToCents(margin) },
    total: roundToCents(total),
  };
}
