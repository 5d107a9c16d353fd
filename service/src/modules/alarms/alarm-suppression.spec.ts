/**
 * Suppression by design and by state. The rules are the product's (high-high over high; an absolute limit over the
 * rise above ambient and the rate of rise where marked related), after the "suppressed by design" idea of
 * ANSI/ISA-18.2-2016 §11.3 and EEMUA 191 (3rd ed.) §4.4, from memory.
 */
import { DESIGN_SUPPRESSION_RULE_WORDS } from '@crankjournal/shared-types';
import { designSuppressionRuleTexts, designSuppressor, suppressedByState, type ActiveCondition } from './alarm-suppression.js';

const hh: ActiveCondition = { id: 'hh', kind: 'high_high', conditionActive: true };
const hi: ActiveCondition = { id: 'hi', kind: 'high', conditionActive: true };

describe('suppression by design', () => {
  it('high-high suppresses high on the same point', () => {
    expect(designSuppressor('high', [hh], false)?.id).toBe('hh');
    expect(designSuppressor('high', [hh], true)?.id).toBe('hh');
  });

  it('the 152 °F round: high-high annunciated, high and rise above ambient suppressed by high-high', () => {
    expect(designSuppressor('high_high', [], true)).toBeNull();
    expect(designSuppressor('high', [hh], true)?.id).toBe('hh');
    expect(designSuppressor('above_ambient', [hh, hi], true)?.id).toBe('hh');
    expect(designSuppressor('rate_of_rise', [hh, hi], true)?.id).toBe('hh');
  });

  it('rise above ambient and rate of rise are suppressed only where the point marks them related', () => {
    expect(designSuppressor('above_ambient', [hh, hi], false)).toBeNull();
    expect(designSuppressor('rate_of_rise', [hi], false)).toBeNull();
  });

  it('release: once high-high has returned to normal, high suppresses the rise above ambient, and nothing suppresses high', () => {
    const hhCleared = { ...hh, conditionActive: false };
    expect(designSuppressor('high', [hhCleared], true)).toBeNull();
    expect(designSuppressor('above_ambient', [hhCleared, hi], true)?.id).toBe('hi');
    expect(designSuppressor('above_ambient', [hhCleared, { ...hi, conditionActive: false }], true)).toBeNull();
  });

  it('nothing suppresses a high-high, a low, an overspeed or an above-MAWP alarm', () => {
    for (const k of ['high_high', 'low', 'overspeed', 'above_mawp'] as const) expect(designSuppressor(k, [hh, hi], true)).toBeNull();
  });

  it('states the rules in words for the engine page', () => {
    // The words the engine page shows (shared-types) say exactly what the rule table does.
    expect(designSuppressionRuleTexts()).toEqual(DESIGN_SUPPRESSION_RULE_WORDS);
  });
});

describe('suppression by state', () => {
  it('suppresses in the listed run states only', () => {
    expect(suppressedByState(['preparing'], 'preparing')).toBe(true);
    expect(suppressedByState(['preparing'], 'running')).toBe(false);
    expect(suppressedByState([], 'preparing')).toBe(false);
    expect(suppressedByState(['preparing'], null)).toBe(false);
  });
});
