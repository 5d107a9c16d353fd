import { buildQuote, stockTonnesRequired, roundToCents } from './quote.js';

// Arithmetic checks of the quoting rules (common practice, no source).
describe('stock weight after yield loss', () => {
  it('10 t of product at 10 % yield loss needs 11.111 t of stock (not 11.0 t)', () => {
    expect(stockTonnesRequired(10, 0.1)).toBeCloseTo(11.111, 3);
    expect(stockTonnesRequired(10, 0.1)).not.toBeCloseTo(11.0, 2);
  });
  it('no loss needs exactly the product weight; a loss of 1 or more is rejected', () => {
    expect(stockTonnesRequired(7.5, 0)).toBe(7.5);
    expect(() => stockTonnesRequired(10, 1)).toThrow(RangeError);
    expect(() => stockTonnesRequired(10, -0.1)).toThrow(RangeError);
  });
});

describe('quote lines and totals', () => {
  const input = {
    productTonnes: 10,
    yieldLossFraction: 0.1,
    stockRatePerTonne: 900,
    engineHours: 6,
    engineRatePerHour: 250,
    crewHours: 8,
    crewSize: 5,
    crewRatePerPersonHour: 22.5,
    fixedCosts: [
      { label: 'Reheat furnace firing', amount: 1200 },
      { label: 'Inspection and paperwork', amount: 150 },
    ],
    contingencyPct: 10,
    marginPct: 15,
  };

  it('each line is quantity × rate; crew is hours × crew size × rate', () => {
    const q = buildQuote(input);
    expect(q.lines.map((l) => l.label)).toEqual(['Stock', 'Engine time', 'Crew (5)', 'Reheat furnace firing', 'Inspection and paperwork']);
    expect(q.lines[0].quantity).toBeCloseTo(11.111, 3);
    expect(q.lines[0].amount).toBe(10000); // 11.111… t × 900 = 10,000.00
    expect(q.lines[1].amount).toBe(1500);
    expect(q.lines[2].quantity).toBe(40);
    expect(q.lines[2].amount).toBe(900);
  });

  it('subtotal 13,750; contingency 10 % = 1,375; margin 15 % of 15,125 = 2,268.75; total 17,393.75', () => {
    const q = buildQuote(input);
    expect(q.subtotal).toBe(13750);
    expect(q.contingency.amount).toBe(1375);
    expect(q.margin.amount).toBe(2268.75);
    expect(q.total).toBe(17393.75);
  });

  it('rounds to cents only at the end: two lines of 10.004 and 20.004 total 30.01, not 30.00', () => {
    const q = buildQuote({
      productTonnes: 0,
      yieldLossFraction: 0,
      stockRatePerTonne: 0,
      engineHours: 2,
      engineRatePerHour: 5.002,
      crewHours: 4,
      crewSize: 1,
      crewRatePerPersonHour: 5.001,
    });
    expect(q.lines[1].amount).toBe(10);
    expect(q.lines[2].amount).toBe(20);
    expect(q.total).toBe(30.01);
  });

  it('rounding is half away from zero and survives binary fractions', () => {
    expect(roundToCents(1.005)).toBe(1.01);
    expect(roundToCents(2.675)).toBe(2.68);
    expect(roundToCents(-1.005)).toBe(-1.01);
    expect(roundToCents(0.1 + 0.2)).toBe(0.3);
  });

  it('rejects negative rates and costs', () => {
    expect(() => buildQuote({ ...input, engineRatePerHour: -1 })).toThrow(RangeError);
    expect(() => buildQuote({ ...input, fixedCosts: [{ label: 'refund', amount: -5 }] })).toThrow(RangeError);
  });
});
