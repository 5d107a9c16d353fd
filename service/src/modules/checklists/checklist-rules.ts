import {
  acceptanceRangeText,
  checklistUnitText,
  readingOutOfRange,
  type ChecklistEntryValue,
  type ChecklistItemDef,
  type ChecklistSectionDef,
  type ChecklistTemplateContent,
} from '@crankjournal/shared-types';

/** The stored state of one item of a checklist (only the field of the item's kind is used). */
export interface EntryState {
  tick: boolean | null;
  value: number | null;
  choice: string | null;
  text: string | null;
  hasPhoto: boolean;
  /** The value an override was recorded for; it holds only while the value is unchanged. */
  overrideValue: ChecklistEntryValue | null;
}

export const KEY_PATTERN = /^[A-Za-z0-9_-]{1,64}$/;

/** Cross-field checks of a template's content (the DTO checks each field alone). */
export function validateTemplateContent(c: ChecklistTemplateContent): string[] {
  const errs: string[] = [];
  const sectionKeys = new Set<string>();
  const itemKeys = new Set<string>();
  let items = 0;
  c.sections.forEach((s, si) => {
    if (sectionKeys.has(s.key)) errs.push(`sections.${si}.key "${s.key}" is used twice`);
    sectionKeys.add(s.key);
    if (!s.items.length) errs.push(`sections.${si} ("${s.title}") has no items`);
    s.items.forEach((it, ii) => {
      items++;
      const at = `sections.${si}.items.${ii}`;
      if (itemKeys.has(it.key)) errs.push(`${at}.key "${it.key}" is used twice in this template`);
      itemKeys.add(it.key);
      if (it.kind === 'reading') {
        if (!it.unit?.trim()) errs.push(`${at} ("${it.label}") is a reading and needs a unit`);
        if (it.min != null && it.max != null && it.min > it.max) errs.push(`${at}.min must not be above max`);
      } else if (it.unit || it.min != null || it.max != null) {
        errs.push(`${at} ("${it.label}"): unit, min and max belong to readings only`);
      }
      if (it.kind === 'choice') {
        const choices = it.choices ?? [];
        if (choices.length < 2) errs.push(`${at} ("${it.label}") is a choice and needs at least two options`);
        if (new Set(choices.map((x) => x.trim().toLowerCase())).size !== choices.length)
          errs.push(`${at}.choices holds the same option twice`);
        for (const a of it.acceptable ?? []) if (!choices.includes(a)) errs.push(`${at}.acceptable "${a}" is not one of its choices`);
      } else if (it.choices?.length || it.acceptable?.length) {
        errs.push(`${at} ("${it.label}"): choices belong to choice items only`);
      }
    });
  });
  if (items === 0) errs.push('a checklist needs at least one item');
  return errs;
}

/** Every item of the content, in order. */
export function itemsOf(sections: ChecklistSectionDef[]): ChecklistItemDef[] {
  return sections.flatMap((s) => s.items);
}

/** The value of an entry for its item's kind (what amendments and overrides compare). */
export function valueOf(item: ChecklistItemDef, e: EntryState | null | undefined): ChecklistEntryValue {
  switch (item.kind) {
    case 'tick':
      return { tick: e?.tick ?? null };
    case 'reading':
      return { value: e?.value ?? null };
    case 'choice':
      return { choice: e?.choice ?? null };
    case 'note':
      return { text: e?.text ?? null };
    case 'photo':
      return {};
  }
}

export function sameValue(a: ChecklistEntryValue | null, b: ChecklistEntryValue | null): boolean {
  if (!a || !b) return false;
  return (
    (a.tick ?? null) === (b.tick ?? null) &&
    (a.value ?? null) === (b.value ?? null) &&
    (a.choice ?? null) === (b.choice ?? null) &&
    (a.text ?? null) === (b.text ?? null)
  );
}

/** Whether the item has been done: ticked, read, chosen, written or photographed. */
export function isDone(item: ChecklistItemDef, e: EntryState | null | undefined): boolean {
  if (!e) return false;
  switch (item.kind) {
    case 'tick':
      return e.tick === true;
    case 'reading':
      return typeof e.value === 'number' && Number.isFinite(e.value);
    case 'choice':
      return e.choice !== null && (item.choices ?? []).includes(e.choice);
    case 'note':
      return !!e.text?.trim();
    case 'photo':
      return e.hasPhoto;
  }
}

/** A reading outside its acceptance range (ends inclusive), or a choice that is not one of the acceptable ones. */
export function isOutOfRange(item: ChecklistItemDef, e: EntryState | null | undefined): boolean {
  if (!e || !isDone(item, e)) return false;
  if (item.kind === 'reading') {
    return readingOutOfRange(item, e.value!);
  }
  if (item.kind === 'choice') {
    const ok = item.acceptable ?? [];
    return ok.length > 0 && !ok.includes(e.choice!);
  }
  return false;
}

/** An override holds only for the value it was given for. */
export function overrideHolds(item: ChecklistItemDef, e: EntryState | null | undefined): boolean {
  return !!e?.overrideValue && sameValue(e.overrideValue, valueOf(item, e));
}

export function unitText(unit: string | undefined): string {
  return checklistUnitText(unit);
}

/** "15 to 30 psig", "at least 15 psig", "at most 30 psig" or "" for an open range. */
export function rangeText(item: Pick<ChecklistItemDef, 'min' | 'max' | 'unit'>): string {
  return acceptanceRangeText(item);
}

export interface Progress {
  requiredItems: number;
  requiredDone: number;
  totalItems: number;
  totalDone: number;
  /** Out-of-range items without an override that holds. */
  blockedItems: number;
}

export function progressOf(sections: ChecklistSectionDef[], entries: Map<string, EntryState>): Progress {
  const items = itemsOf(sections);
  const p: Progress = { requiredItems: 0, requiredDone: 0, totalItems: items.length, totalDone: 0, blockedItems: 0 };
  for (const it of items) {
    const e = entries.get(it.key);
    const done = isDone(it, e);
    if (it.required) p.requiredItems++;
    if (done) {
      p.totalDone++;
      if (it.required) p.requiredDone++;
    }
    if (isOutOfRange(it, e) && !overrideHolds(it, e)) p.blockedItems++;
  }
  return p;
}

/** Why a checklist cannot be signed yet, one line per item; empty when it can. */
export function signBlockers(sections: ChecklistSectionDef[], entries: Map<string, EntryState>): string[] {
  const out: string[] = [];
  for (const it of itemsOf(sections)) {
    const e = entries.get(it.key);
    if (it.required && !isDone(it, e)) out.push(`${it.label}: not done yet.`);
    else if (isOutOfRange(it, e) && !overrideHolds(it, e)) {
      out.push(
        it.kind === 'reading'
          ? `${it.label}: ${e!.value} ${unitText(it.unit)} is outside the acceptance range (${rangeText(it)}). ` +
              'Put it right and read again, or the chief engineer records an override with a reason.'
          : `${it.label}: "${e!.choice}" is not acceptable (acceptable: ${(it.acceptable ?? []).join(', ')}). ` +
              'Put it right, or the chief engineer records an override with a reason.',
      );
    }
  }
  return out;
}

/**
 * Checks a value given for an item and returns the entry fields to store; throws an Error with a readable
 * message when the value does not fit the item's kind.
 */
export function normaliseValue(item: ChecklistItemDef, v: ChecklistEntryValue): Pick<EntryState, 'tick' | 'value' | 'choice' | 'text'> {
  const given = (['tick', 'value', 'choice', 'text'] as const).filter((k) => v[k] !== undefined);
  const field =
    item.kind === 'tick'
      ? 'tick'
      : item.kind === 'reading'
        ? 'value'
        : item.kind === 'choice'
          ? 'choice'
          : item.kind === 'note'
            ? 'text'
            : null;
  if (!field) throw new Error(`${item.label} is a photo item: upload the photo instead.`);
  const wrong = given.filter((k) => k !== field);
  if (wrong.length) throw new Error(`${item.label} takes ${field}, not ${wrong.join(', ')}.`);
  if (!given.length) throw new Error(`Give ${field} for ${item.label}.`);
  const out = { tick: null as boolean | null, value: null as number | null, choice: null as string | null, text: null as string | null };
  if (field === 'tick') out.tick = v.tick ?? null;
  if (field === 'value') out.value = v.value ?? null;
  if (field === 'choice') {
    if (v.choice != null && !(item.choices ?? []).includes(v.choice))
      throw new Error(`${item.label}: choose one of ${(item.choices ?? []).join(', ')}.`);
    out.choice = v.choice ?? null;
  }
  if (field === 'text') out.text = v.text?.trim() ? v.text.trim() : null;
  return out;
}
