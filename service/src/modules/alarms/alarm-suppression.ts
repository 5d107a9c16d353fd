/**
 * Suppression by design and by state: which alarm of a point is annunciated when several of its conditions are
 * present at once, and which alarms mean nothing in the engine's present state. Pure functions.
 *
 * The idea follows the alarm-management standards' "designed suppression" (ANSI/ISA-18.2-2016 §4 and §11.3,
 * suppressed by design; EEMUA 191, 3rd ed., 2013, §4.4 on logical suppression of consequential alarms), from
 * memory: a suppressed alarm is still detected and recorded, it is not shown as a new alarm nor counted as waiting,
 * and it comes back as soon as what suppressed it is gone.
 *
 * The rules (a product choice):
 * - High-high suppresses high on the same point.
 * - An absolute limit (high-high, then high) suppresses the rise above ambient and the rate of rise of the same
 *   point, where the chief engineer has marked the point's conditions as related (`relatedSuppression`).
 * - A point may be suppressed by state: the chief engineer lists the run states in which its alarms are not
 *   meaningful (oil pressure low while the engine rests before pre-lube, speed low during warm-up).
 */
import type { AlarmConditionKind } from './alarm-rules.js';

/** Which condition kinds a condition kind suppresses, strongest suppressor first. */
export const DESIGN_SUPPRESSION_RULES: readonly {
  suppressor: AlarmConditionKind;
  suppressed: AlarmConditionKind;
  needsRelated: boolean;
}[] = [
  { suppressor: 'high_high', suppressed: 'high', needsRelated: false },
  { suppressor: 'high_high', suppressed: 'rate_of_rise', needsRelated: true },
  { suppressor: 'high_high', suppressed: 'above_ambient', needsRelated: true },
  { suppressor: 'high', suppressed: 'rate_of_rise', needsRelated: true },
  { suppressor: 'high', suppressed: 'above_ambient', needsRelated: true },
];

/** The rules in plain words, for the engine page. */
export function designSuppressionRuleTexts(): string[] {
  const label: Record<AlarmConditionKind, string> = {
    high: 'high',
    high_high: 'high-high',
    low: 'low',
    rate_of_rise: 'rising too fast',
    above_ambient: 'too far above ambient',
    above_mawp: 'above maximum allowable working pressure',
    overspeed: 'overspeed',
  };
  return DESIGN_SUPPRESSION_RULES.map(
    (r) =>
      `While ${label[r.suppressor]} is active on a point, its ${label[r.suppressed]} alarm is recorded but suppressed` +
      (r.needsRelated ? ' (where marked related).' : '.'),
  );
}

/** An active alarm of the same point that could suppress another. */
export interface ActiveCondition<Id = string> {
  id: Id;
  kind: AlarmConditionKind;
  /** Condition present (returned-to-normal alarms suppress nothing). */
  conditionActive: boolean;
  /** Alarms that are themselves suppressed still suppress lower ones (high-high over high over ambient). */
}

/**
 * The alarm that suppresses a `kind` alarm of the point, given the point's other alarms: the strongest active
 * suppressor, or null when the alarm is to be annunciated.
 */
export function designSuppressor<Id>(
  kind: AlarmConditionKind,
  others: readonly ActiveCondition<Id>[],
  relatedSuppression: boolean,
): ActiveCondition<Id> | null {
  for (const rule of DESIGN_SUPPRESSION_RULES) {
    if (rule.suppressed !== kind) continue;
    if (rule.needsRelated && !relatedSuppression) continue;
    const hit = others.find((o) => o.kind === rule.suppressor && o.conditionActive);
    if (hit) return hit;
  }
  return null;
}

/** Whether a point's alarms are suppressed in the run state (the chief engineer's list for the point). */
export function suppressedByState(suppressedInStates: readonly string[] | null | undefined, runState: string | null | undefined): boolean {
  if (!runState || !suppressedInStates) return false;
  return suppressedInStates.includes(runState);
}
