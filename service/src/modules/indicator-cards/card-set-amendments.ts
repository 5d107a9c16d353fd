import type { EntityManager } from 'typeorm';
import type { FieldChange, RecordAmendmentDto } from '@crankjournal/shared-types';
import { CardRecordAmendment, type AmendedSubject } from './card-record-amendment.entity.js';

/** Records one amendment (what changed, why, by whom) of a card, a card set or a brake figure, in the caller's transaction. */
export async function recordAmendment(
  m: EntityManager,
  subjectType: AmendedSubject,
  subjectId: string,
  runId: string,
  changes: FieldChange[],
  reason: string,
  byUser: string,
  at = new Date(),
) {
  await m.save(
    CardRecordAmendment,
    m.create(CardRecordAmendment, { subjectType, subjectId, runId, changes, reason: reason.trim(), byUser, at }),
  );
}

/** Amendments as the API shows them, grouped by the record they amend, oldest first. */
export function amendmentsBySubject(amendments: CardRecordAmendment[], names: Map<string, string>): Map<string, RecordAmendmentDto[]> {
  const bySubject = new Map<string, RecordAmendmentDto[]>();
  for (const a of amendments) {
    const list = bySubject.get(a.subjectId) ?? [];
    list.push({
      id: a.id,
      reason: a.reason,
      by: a.byUser,
      byName: names.get(a.byUser) ?? 'unknown',
      at: a.at.toISOString(),
      changes: a.changes,
    });
    bySubject.set(a.subjectId, list);
  }
  return bySubject;
}
