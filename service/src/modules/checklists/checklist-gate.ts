import { GATE_REASON_CODES, type ChecklistPurpose, type ChecklistRequiredWhen, type StartGateReason } from '@crankjournal/shared-types';

export interface GateTemplate {
  id: string;
  name: string;
  purpose: ChecklistPurpose;
  requiredWhen: ChecklistRequiredWhen;
}
export interface GateChecklist {
  id: string;
  templateId: string;
  status: 'in_progress' | 'signed';
  signedAt: Date | null;
  signedByName: string | null;
  requiredItems: number;
  requiredDone: number;
  startedAt: Date;
}
export interface GateVerdictPart {
  reasons: StartGateReason[];
  preLubeFreshUntil?: string | null;
}

const MS_PER_MINUTE = 60_000;

/** When a pre-lube sign-off stops being fresh. */
export function preLubeFreshUntil(signedAt: Date, freshnessMinutes: number): Date {
  return new Date(signedAt.getTime() + freshnessMinutes * MS_PER_MINUTE);
}

/** "45 s", "12 min", "2 h 05 min". */
export function formatAge(ms: number): string {
  const s = Math.max(0, Math.floor(ms / 1000));
  if (s < 60) return `${s} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min`;
  return `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`;
}

/** The latest signed checklist and the newest one still being filled, for each template. */
export function latestByTemplate(checklists: GateChecklist[]): Map<string, { signed: GateChecklist | null; open: GateChecklist | null }> {
  const out = new Map<string, { signed: GateChecklist | null; open: GateChecklist | null }>();
  for (const c of checklists) {
    const cur = out.get(c.templateId) ?? { signed: null, open: null };
    if (c.status === 'signed') {
      if (!cur.signed || (c.signedAt && cur.signed.signedAt && c.signedAt > cur.signed.signedAt)) cur.signed = c;
    } else if (!cur.open || c.startedAt > cur.open.startedAt) cur.open = c;
    out.set(c.templateId, cur);
  }
  return out;
}

function missingOrUnsigned(
  t: GateTemplate,
  open: GateChecklist | null,
  codes: { missing: string; unsigned: string },
  when: string,
): StartGateReason {
  if (!open)
    return {
      code: codes.missing,
      message: `${t.name}: no checklist has been started for this run. Fill it and sign it ${when}.`,
      subject: t.name,
    };
  return {
    code: codes.unsigned,
    message:
      `${t.name}: started but not signed (${open.requiredDone} of ${open.requiredItems} required items done). ` +
      `Finish it and sign it ${when}.`,
    subject: t.name,
  };
}

export interface StartChecklistInput {
  /** Published, not retired templates of the run's engine. */
  templates: GateTemplate[];
  /** Every checklist of this run. */
  checklists: GateChecklist[];
  now: Date;
  engineName: string;
  preLubeFreshnessMinutes: number;
  /** For each signed checklist id, what is now wrong with its signer's qualification (null when still qualified). */
  signerProblems: Map<string, string | null>;
}

/**
 * The checklist part of the start gate: every template required before a start has a signed checklist for
 * this run; its signer is still qualified; and the latest pre-lube sign-off is younger than the engine's window.
 */
export function evaluateStartChecklists(input: StartChecklistInput): GateVerdictPart {
  const reasons: StartGateReason[] = [];
  const latest = latestByTemplate(input.checklists);
  let freshUntil: Date | null = null;
  for (const t of input.templates.filter((x) => x.requiredWhen === 'before_start')) {
    const { signed, open } = latest.get(t.id) ?? { signed: null, open: null };
    if (!signed) {
      reasons.push(
        missingOrUnsigned(
          t,
          open,
          { missing: GATE_REASON_CODES.checklistMissing, unsigned: GATE_REASON_CODES.checklistUnsigned },
          'before the start',
        ),
      );
      continue;
    }
    const problem = input.signerProblems.get(signed.id);
    if (problem)
      reasons.push({
        code: GATE_REASON_CODES.signerNotQualified,
        message: `${t.name} was signed by ${signed.signedByName ?? 'someone'}: ${problem} Have it signed again by someone qualified.`,
        subject: t.name,
      });
    if (t.purpose === 'pre_lube' && signed.signedAt) {
      const until = preLubeFreshUntil(signed.signedAt, input.preLubeFreshnessMinutes);
      if (!freshUntil || until < freshUntil) freshUntil = until;
      if (until.getTime() <= input.now.getTime()) {
        reasons.push({
          code: GATE_REASON_CODES.preLubeStale,
          message:
            `The pre-lube sign-off (${t.name}) is ${formatAge(input.now.getTime() - signed.signedAt.getTime())} old; ` +
            `${input.engineName}'s window is ${input.preLubeFreshnessMinutes} min, because oil drains from under the loaded journals. ` +
            `Pre-lube again and sign a new ${t.name} checklist.`,
          subject: t.name,
        });
      }
    }
  }
  return { reasons, ...(freshUntil ? { preLubeFreshUntil: freshUntil.toISOString() } : {}) };
}

/** The close gate: every template required after a stop has a signed checklist for this run. */
export function evaluateCloseChecklists(templates: GateTemplate[], checklists: GateChecklist[]): GateVerdictPart {
  const latest = latestByTemplate(checklists);
  const reasons: StartGateReason[] = [];
  for (const t of templates.filter((x) => x.requiredWhen === 'after_stop')) {
    const { signed, open } = latest.get(t.id) ?? { signed: null, open: null };
    if (!signed)
      reasons.push(
        missingOrUnsigned(
          t,
          open,
          { missing: GATE_REASON_CODES.shutdownChecklistMissing, unsigned: GATE_REASON_CODES.shutdownChecklistUnsigned },
          'before the run is closed',
        ),
      );
  }
  return { reasons };
}

/** True when every template required before a start has a signed checklist (the run may then be cleared). */
export function allStartChecklistsSigned(templates: GateTemplate[], checklists: GateChecklist[]): boolean {
  const latest = latestByTemplate(checklists);
  const required = templates.filter((t) => t.requiredWhen === 'before_start');
  return required.length > 0 && required.every((t) => !!latest.get(t.id)?.signed);
}
