import type { ChecklistItemDef, ChecklistTemplateContent } from '@crankjournal/shared-types';
import {
  isDone,
  isOutOfRange,
  normaliseValue,
  overrideHolds,
  progressOf,
  rangeText,
  signBlockers,
  validateTemplateContent,
  type EntryState,
} from './checklist-rules.js';

// Acceptance ranges are inclusive at both ends (a gauge reading exactly at the stated limit is within it:
// common practice, no source). The items below are invented.
const tick: ChecklistItemDef = { key: 'drains', kind: 'tick', label: 'Drain cocks open', required: true };
const pressure: ChecklistItemDef = {
  key: 'line-p',
  kind: 'reading',
  label: 'Pre-lube line pressure',
  required: true,
  unit: 'psig',
  min: 15,
  max: 30,
};
const level: ChecklistItemDef = { key: 'level', kind: 'reading', label: 'Sump level', required: true, unit: 'in', min: 4, max: null };
const barring: ChecklistItemDef = {
  key: 'barring',
  kind: 'choice',
  label: 'Barring gear',
  required: true,
  choices: ['Disengaged and locked out', 'Engaged'],
  acceptable: ['Disengaged and locked out'],
};
const note: ChecklistItemDef = { key: 'note', kind: 'note', label: 'Remarks', required: false };
const photo: ChecklistItemDef = { key: 'photo', kind: 'photo', label: 'Photo of the gauge board', required: false };

const entry = (p: Partial<EntryState>): EntryState => ({
  tick: null,
  value: null,
  choice: null,
  text: null,
  hasPhoto: false,
  overrideValue: null,
  ...p,
});

describe('items', () => {
  it('is done only when ticked, read, chosen, written or photographed', () => {
    expect(isDone(tick, entry({ tick: true }))).toBe(true);
    expect(isDone(tick, entry({ tick: false }))).toBe(false);
    expect(isDone(pressure, entry({ value: 0 }))).toBe(true);
    expect(isDone(pressure, entry({}))).toBe(false);
    expect(isDone(barring, entry({ choice: 'Engaged' }))).toBe(true);
    expect(isDone(barring, entry({ choice: 'Something else' }))).toBe(false);
    expect(isDone(note, entry({ text: '   ' }))).toBe(false);
    expect(isDone(photo, entry({ hasPhoto: true }))).toBe(true);
    expect(isDone(tick, undefined)).toBe(false);
  });

  it('judges a reading against its range, ends inclusive, either end open', () => {
    expect(isOutOfRange(pressure, entry({ value: 15 }))).toBe(false);
    expect(isOutOfRange(pressure, entry({ value: 30 }))).toBe(false);
    expect(isOutOfRange(pressure, entry({ value: 14.9 }))).toBe(true);
    expect(isOutOfRange(pressure, entry({ value: 30.1 }))).toBe(true);
    expect(isOutOfRange(level, entry({ value: 400 }))).toBe(false);
    expect(isOutOfRange(level, entry({ value: 3 }))).toBe(true);
    expect(isOutOfRange(pressure, entry({}))).toBe(false);
  });

  it('judges a choice against the acceptable options', () => {
    expect(isOutOfRange(barring, entry({ choice: 'Engaged' }))).toBe(true);
    expect(isOutOfRange(barring, entry({ choice: 'Disengaged and locked out' }))).toBe(false);
  });

  it('lets an override hold only for the value it was recorded for', () => {
    const e = entry({ value: 12, overrideValue: { value: 12 } });
    expect(overrideHolds(pressure, e)).toBe(true);
    expect(overrideHolds(pressure, { ...e, value: 11 })).toBe(false);
  });

  it('words ranges', () => {
    expect(rangeText(pressure)).toBe('15 to 30 psig');
    expect(rangeText(level)).toBe('at least 4 in');
    expect(rangeText({ max: 180, unit: 'degF' })).toBe('at most 180 °F');
  });
});

describe('progress and signing', () => {
  const sections = [{ key: 's1', title: 'Before', items: [tick, pressure, barring, note] }];

  it('counts required and optional items separately and blocked ones', () => {
    const entries = new Map([
      ['drains', entry({ tick: true })],
      ['line-p', entry({ value: 10 })],
    ]);
    expect(progressOf(sections, entries)).toEqual({ requiredItems: 3, requiredDone: 2, totalItems: 4, totalDone: 2, blockedItems: 1 });
  });

  it('lists what blocks a signature: items not done and out-of-range values without an override', () => {
    const entries = new Map([
      ['drains', entry({ tick: true })],
      ['line-p', entry({ value: 10 })],
    ]);
    const b = signBlockers(sections, entries);
    expect(b).toHaveLength(2);
    expect(b[0]).toContain('Pre-lube line pressure: 10 psig is outside the acceptance range (15 to 30 psig)');
    expect(b[1]).toBe('Barring gear: not done yet.');
  });

  it('has nothing to block once every required item is done and overrides hold', () => {
    const entries = new Map([
      ['drains', entry({ tick: true })],
      ['line-p', entry({ value: 10, overrideValue: { value: 10 } })],
      ['barring', entry({ choice: 'Disengaged and locked out' })],
    ]);
    expect(signBlockers(sections, entries)).toEqual([]);
  });
});

describe('values given for items', () => {
  it('takes only the field of the item kind', () => {
    expect(normaliseValue(pressure, { value: 22 })).toEqual({ tick: null, value: 22, choice: null, text: null });
    expect(() => normaliseValue(pressure, { tick: true })).toThrow(/takes value, not tick/);
    expect(() => normaliseValue(barring, { choice: 'Maybe' })).toThrow(/choose one of/);
    expect(() => normaliseValue(photo, { text: 'x' })).toThrow(/upload the photo/);
    expect(normaliseValue(note, { text: '  ' }).text).toBeNull();
  });
});

describe('template content', () => {
  const base: ChecklistTemplateContent = {
    name: 'Pre-lube',
    purpose: 'pre_lube',
    requiredWhen: 'before_start',
    requiredDuty: 'pre_lube',
    description: '',
    sections: [{ key: 's1', title: 'Lines', items: [tick, pressure] }],
  };
  it('accepts a sound template', () => {
    expect(validateTemplateContent(base)).toEqual([]);
  });
  it('refuses duplicate keys, readings without a unit, inverted ranges and bad choices', () => {
    const bad: ChecklistTemplateContent = {
      ...base,
      sections: [
        { key: 's1', title: 'A', items: [tick, { ...tick }] },
        {
          key: 's1',
          title: 'B',
          items: [
            { ...pressure, key: 'p2', unit: '', min: 40, max: 30 },
            { ...barring, choices: ['One'], acceptable: ['Two'] },
          ],
        },
      ],
    };
    const errs = validateTemplateContent(bad);
    expect(errs.some((e) => e.includes('sections.1.key "s1" is used twice'))).toBe(true);
    expect(errs.some((e) => e.includes('key "drains" is used twice'))).toBe(true);
    expect(errs.some((e) => e.includes('needs a unit'))).toBe(true);
    expect(errs.some((e) => e.includes('min must not be above max'))).toBe(true);
    expect(errs.some((e) => e.includes('at least two options'))).toBe(true);
    expect(errs.some((e) => e.includes('"Two" is not one of its choices'))).toBe(true);
  });
  it('refuses an empty template', () => {
    expect(validateTemplateContent({ ...base, sections: [] })).toContain('a checklist needs at least one item');
  });
});
