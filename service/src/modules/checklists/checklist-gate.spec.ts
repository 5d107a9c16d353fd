import {
  allStartChecklistsSigned,
  evaluateCloseChecklists,
  evaluateStartChecklists,
  formatAge,
  preLubeFreshUntil,
  type GateChecklist,
  type GateTemplate,
} from './checklist-gate.js';

// The gate's rules come from the product brief (a start needs every required checklist signed, a fresh
// pre-lube sign-off and qualified signers); the times below are plain clock arithmetic
// (common practice, no source: 60 s to the minute).
const preLube: GateTemplate = { id: 't-lube', name: 'Pre-lube', purpose: 'pre_lube', requiredWhen: 'before_start' };
const inspection: GateTemplate = {
  id: 't-insp',
  name: 'Pre-start inspection',
  purpose: 'pre_start_inspection',
  requiredWhen: 'before_start',
};
const warmUp: GateTemplate = { id: 't-warm', name: 'Warm-up', purpose: 'warm_up', requiredWhen: 'not_required' };
const shutdown: GateTemplate = { id: 't-shut', name: 'Shutdown', purpose: 'shutdown', requiredWhen: 'after_stop' };
const templates = [preLube, inspection, warmUp, shutdown];

const now = new Date('2026-12-05T10:00:00Z');
const minutesAgo = (m: number) => new Date(now.getTime() - m * 60_000);
const signed = (templateId: string, signedMinutesAgo: number, id = `c-${templateId}-${signedMinutesAgo}`): GateChecklist => ({
  id,
  templateId,
  status: 'signed',
  signedAt: minutesAgo(signedMinutesAgo),
  signedByName: 'A. Operator',
  requiredItems: 5,
  requiredDone: 5,
  startedAt: minutesAgo(signedMinutesAgo + 10),
});
const open = (templateId: string, done: number): GateChecklist => ({
  id: `o-${templateId}`,
  templateId,
  status: 'in_progress',
  signedAt: null,
  signedByName: null,
  requiredItems: 8,
  requiredDone: done,
  startedAt: minutesAgo(5),
});
const input = (checklists: GateChecklist[], signerProblems = new Map<string, string | null>()) => ({
  templates,
  checklists,
  now,
  engineName: 'No. 2 engine',
  preLubeFreshnessMinutes: 30,
  signerProblems,
});

describe('the checklist part of the start gate', () => {
  it('allows a start when every required checklist is signed and the pre-lube is fresh', () => {
    const v = evaluateStartChecklists(input([signed('t-lube', 10), signed('t-insp', 20)]));
    expect(v.reasons).toEqual([]);
    expect(v.preLubeFreshUntil).toBe('2026-12-05T10:20:00.000Z');
  });

  it('refuses with checklist_missing when a required checklist was never started', () => {
    const v = evaluateStartChecklists(input([signed('t-lube', 10)]));
    expect(v.reasons.map((r) => r.code)).toEqual(['checklist_missing']);
    expect(v.reasons[0].subject).toBe('Pre-start inspection');
    expect(v.reasons[0].message).toContain('Pre-start inspection');
  });

  it('refuses with checklist_unsigned, saying how far it got, when it is started but not signed', () => {
    const v = evaluateStartChecklists(input([signed('t-lube', 10), open('t-insp', 3)]));
    expect(v.reasons.map((r) => r.code)).toEqual(['checklist_unsigned']);
    expect(v.reasons[0].message).toContain('3 of 8 required items done');
  });

  it('refuses with pre_lube_stale once the window has passed, saying how old the sign-off is', () => {
    const v = evaluateStartChecklists(input([signed('t-lube', 43), signed('t-insp', 20)]));
    expect(v.reasons.map((r) => r.code)).toEqual(['pre_lube_stale']);
    expect(v.reasons[0].message).toContain('43 min old');
    expect(v.reasons[0].message).toContain('window is 30 min');
    expect(v.preLubeFreshUntil).toBe('2026-12-05T09:47:00.000Z');
  });

  it('treats the end of the window itself as stale', () => {
    expect(evaluateStartChecklists(input([signed('t-lube', 30), signed('t-insp', 20)])).reasons.map((r) => r.code)).toEqual([
      'pre_lube_stale',
    ]);
    expect(evaluateStartChecklists(input([signed('t-lube', 29.9), signed('t-insp', 20)])).reasons).toEqual([]);
  });

  it('uses the latest pre-lube sign-off: pre-lubing again makes the gate fresh', () => {
    const v = evaluateStartChecklists(input([signed('t-lube', 50), signed('t-lube', 2), signed('t-insp', 20)]));
    expect(v.reasons).toEqual([]);
    expect(v.preLubeFreshUntil).toBe('2026-12-05T10:28:00.000Z');
  });

  it('keeps a signed checklist valid while a new one of the same template is being filled', () => {
    expect(evaluateStartChecklists(input([signed('t-lube', 5), open('t-lube', 1), signed('t-insp', 20)])).reasons).toEqual([]);
  });

  it('refuses with signer_not_qualified when a signer has lost the qualification since', () => {
    const s = signed('t-insp', 20);
    const v = evaluateStartChecklists(
      input([signed('t-lube', 5), s], new Map([[s.id, 'their start and run qualification expired on 2026-12-01.']])),
    );
    expect(v.reasons.map((r) => r.code)).toEqual(['signer_not_qualified']);
    expect(v.reasons[0].message).toContain('A. Operator');
  });

  it('ignores templates that are not required before a start', () => {
    const v = evaluateStartChecklists(input([signed('t-lube', 5), signed('t-insp', 5)]));
    expect(v.reasons.find((r) => r.subject === 'Warm-up' || r.subject === 'Shutdown')).toBeUndefined();
  });

  it('asks nothing of an engine without templates, and gives no freshness then', () => {
    const v = evaluateStartChecklists({ ...input([]), templates: [] });
    expect(v).toEqual({ reasons: [] });
  });

  it('lists every missing condition at once', () => {
    const v = evaluateStartChecklists(input([signed('t-lube', 90)]));
    expect(v.reasons.map((r) => r.code).sort()).toEqual(['checklist_missing', 'pre_lube_stale']);
  });
});

describe('the close gate', () => {
  it('refuses until the shutdown checklist is signed', () => {
    expect(evaluateCloseChecklists(templates, []).reasons.map((r) => r.code)).toEqual(['shutdown_checklist_missing']);
    expect(evaluateCloseChecklists(templates, [open('t-shut', 2)]).reasons.map((r) => r.code)).toEqual(['shutdown_checklist_unsigned']);
    expect(evaluateCloseChecklists(templates, [signed('t-shut', 1)]).reasons).toEqual([]);
  });
});

describe('clearing', () => {
  it('is due only when every template required before a start is signed', () => {
    expect(allStartChecklistsSigned(templates, [signed('t-lube', 1)])).toBe(false);
    expect(allStartChecklistsSigned(templates, [signed('t-lube', 1), open('t-insp', 8)])).toBe(false);
    expect(allStartChecklistsSigned(templates, [signed('t-lube', 1), signed('t-insp', 1)])).toBe(true);
    expect(allStartChecklistsSigned([warmUp], [])).toBe(false);
  });
});

describe('time words', () => {
  it('adds the window to the sign-off time and words ages', () => {
    expect(preLubeFreshUntil(new Date('2026-12-05T09:50:00Z'), 30).toISOString()).toBe('2026-12-05T10:20:00.000Z');
    expect(formatAge(45_000)).toBe('45 s');
    expect(formatAge(43 * 60_000 + 5_000)).toBe('43 min');
    expect(formatAge(125 * 60_000)).toBe('2 h 05 min');
  });
});
