import type { Duty } from '../domain/qualifications.js';
import type { RunState } from '../domain/run.js';

export const CHECKLIST_PURPOSES = ['pre_lube', 'pre_start_inspection', 'warm_up', 'shutdown', 'other'] as const;
export type ChecklistPurpose = (typeof CHECKLIST_PURPOSES)[number];
export const CHECKLIST_PURPOSE_LABELS: Record<ChecklistPurpose, string> = {
  pre_lube: 'Pre-lube',
  pre_start_inspection: 'Pre-start inspection',
  warm_up: 'Warm-up',
  shutdown: 'Shutdown',
  other: 'Other',
};

/**
 * When a template's checklist must be signed for a run: before it may start, after a stop before it may close, or never
 * (kept for the record).
 */
export const CHECKLIST_REQUIRED_WHEN = ['before_start', 'after_stop', 'not_required'] as const;
export type ChecklistRequiredWhen = (typeof CHECKLIST_REQUIRED_WHEN)[number];
export const CHECKLIST_REQUIRED_WHEN_LABELS: Record<ChecklistRequiredWhen, string> = {
  before_start: 'Required before a start',
  after_stop: 'Required after a stop, before closing',
  not_required: 'Not required (kept for the record)',
};
/** The states of a run in which checklists of each kind can be filled and signed. */
export const CHECKLIST_RUN_STATES: Record<ChecklistRequiredWhen, readonly RunState[]> = {
  before_start: ['preparing', 'cleared'],
  after_stop: ['stopped'],
  not_required: ['preparing', 'cleared', 'running', 'stopped'],
};

export const CHECKLIST_ITEM_KINDS = ['tick', 'reading', 'choice', 'note', 'photo'] as const;
export type ChecklistItemKind = (typeof CHECKLIST_ITEM_KINDS)[number];
export const CHECKLIST_ITEM_KIND_LABELS: Record<ChecklistItemKind, string> = {
  tick: 'Tick',
  reading: 'Reading with an acceptance range',
  choice: 'Choice from a list',
  note: 'Note',
  photo: 'Photo',
};

export const HAZARDS = ['pressure', 'rotating_parts', 'hot_surfaces', 'lifting', 'lockout'] as const;
export type Hazard = (typeof HAZARDS)[number];
export const HAZARD_LABELS: Record<Hazard, string> = {
  pressure: 'Pressure',
  rotating_parts: 'Rotating parts',
  hot_surfaces: 'Hot surfaces',
  lifting: 'Lifting',
  lockout: 'Lockout',
};

export interface ItemCaution {
  hazard: Hazard;
  text: string;
}
export interface ChecklistItemDef {
  /** Stable within a template across its versions (letters, digits, - and _). */
  key: string;
  kind: ChecklistItemKind;
  label: string;
  /** How to do it, in a line or two. */
  help?: string;
  /** A required item must be done before signing (notes and photos may be optional). */
  required: boolean;
  /** Reading: the unit and the acceptance range (either end may be open). */
  unit?: string;
  min?: number | null;
  max?: number | null;
  /** Choice: the options, and which of them are acceptable (none given: every option is). */
  choices?: string[];
  acceptable?: string[];
  caution?: ItemCaution | null;
}
export interface ChecklistSectionDef {
  key: string;
  title: string;
  items: ChecklistItemDef[];
}
/** What a version of a template says. */
export interface ChecklistTemplateContent {
  name: string;
  purpose: ChecklistPurpose;
  requiredWhen: ChecklistRequiredWhen;
  /** The qualification a signer must hold (for this engine). */
  requiredDuty: Duty;
  description: string;
  sections: ChecklistSectionDef[];
}

/**
 * Where a checklist template stands, in the engine house's words: in preparation (nothing issued yet), issued (a
 * version is in use; a revision may be in preparation beside it), withdrawn (no longer asked for).
 */
export type ChecklistTemplateState = 'in_preparation' | 'issued' | 'withdrawn';
export const CHECKLIST_TEMPLATE_STATE_WORDS: Record<ChecklistTemplateState, string> = {
  in_preparation: 'In preparation',
  issued: 'Issued',
  withdrawn: 'Withdrawn',
};
/** The words of a template's actions and of its unissued revision, used alike on screen, in PDFs and messages. */
export const CHECKLIST_TEMPLATE_WORDS = {
  revision: 'Revision in preparation',
  issue: 'Issue',
  withdraw: 'Withdraw',
  reissue: 'Reissue',
} as const;

export interface ChecklistTemplateSummary {
  id: string;
  engineId: string;
  engineName: string;
  /** From the current (latest issued) version, or the revision in preparation when nothing is issued yet. */
  name: string;
  purpose: ChecklistPurpose;
  requiredWhen: ChecklistRequiredWhen;
  requiredDuty: Duty;
  /** 0 while nothing is issued. */
  currentVersion: number;
  issuedAt: string | null;
  itemCount: number;
  hasDraft: boolean;
  withdrawn: boolean;
  /** In preparation, issued or withdrawn (CHECKLIST_TEMPLATE_STATE_WORDS). */
  state: ChecklistTemplateState;
}
export interface ChecklistVersionInfo {
  version: number;
  issuedAt: string;
  issuedByName: string;
  changeNote: string;
}
export interface ChecklistTemplateVersionDto extends ChecklistVersionInfo {
  templateId: string;
  content: ChecklistTemplateContent;
}
export interface ChecklistTemplateDetail extends ChecklistTemplateSummary {
  current: ChecklistTemplateVersionDto | null;
  draft: ChecklistTemplateContent | null;
  draftUpdatedAt: string | null;
  versions: ChecklistVersionInfo[];
}
export interface CreateChecklistTemplateRequest extends ChecklistTemplateContent {
  engineId: string;
  /** Issue version 1 at once instead of keeping it in preparation. */
  issue?: boolean;
}
export type SaveChecklistDraftRequest = ChecklistTemplateContent;
export interface IssueChecklistTemplateRequest {
  changeNote?: string;
}

export const CHECKLIST_STATUSES = ['in_progress', 'signed'] as const;
export type ChecklistStatus = (typeof CHECKLIST_STATUSES)[number];

/** A value given to an item; only the field of the item's kind is used. */
export interface ChecklistEntryValue {
  tick?: boolean | null;
  value?: number | null;
  choice?: string | null;
  text?: string | null;
}
export interface ChecklistOverrideDto {
  reason: string;
  byName: string;
  at: string;
}
export interface ChecklistAmendmentDto {
  id: string;
  itemKey: string;
  oldValue: ChecklistEntryValue;
  newValue: ChecklistEntryValue;
  reason: string;
  overrideReason: string | null;
  byName: string;
  at: string;
}
export interface ChecklistEntryDto {
  itemKey: string;
  tick: boolean | null;
  value: number | null;
  choice: string | null;
  text: string | null;
  hasPhoto: boolean;
  done: boolean;
  /** A reading outside its acceptance range, or a choice that is not acceptable. */
  outOfRange: boolean;
  override: ChecklistOverrideDto | null;
  filledByName: string | null;
  filledAt: string | null;
  /** The value as signed, when it has since been amended. */
  original: ChecklistEntryValue | null;
  amendments: ChecklistAmendmentDto[];
}
export interface ChecklistSummary {
  id: string;
  runId: string;
  templateId: string;
  name: string;
  purpose: ChecklistPurpose;
  requiredWhen: ChecklistRequiredWhen;
  requiredDuty: Duty;
  /** The template version it is filled against (and always shown as). */
  version: number;
  status: ChecklistStatus;
  requiredItems: number;
  requiredDone: number;
  totalItems: number;
  totalDone: number;
  /** Out-of-range items without a chief engineer's override. */
  blockedItems: number;
  startedAt: string;
  startedByName: string;
  /** When the server stored the signature. */
  signedAt: string | null;
  /** When the signer signed on a tablet that had no connection (the tablet's clock), or null when signed online. */
  signedOnDeviceAt: string | null;
  signedByName: string | null;
  amendmentCount: number;
}
export interface ChecklistDetail extends ChecklistSummary {
  description: string;
  sections: ChecklistSectionDef[];
  entries: ChecklistEntryDto[];
  engineId: string;
  runState: RunState;
}

export type RunTemplateProgress = 'not_started' | 'in_progress' | 'signed';
export interface RunChecklistTemplateStatus {
  template: ChecklistTemplateSummary;
  progress: RunTemplateProgress;
  /** The latest signed checklist of this template for the run, and one still being filled, if any. */
  signed: ChecklistSummary | null;
  open: ChecklistSummary | null;
  /** Whether a checklist of this template can be filled in the run's present state. */
  fillableNow: boolean;
}
export interface RunChecklistsOverview {
  runId: string;
  engineId: string;
  runState: RunState;
  preLubeFreshnessMinutes: number;
  /** When the latest pre-lube sign-off stops being fresh (ISO), if there is one. */
  preLubeFreshUntil: string | null;
  templates: RunChecklistTemplateStatus[];
  checklists: ChecklistSummary[];
}

export interface StartChecklistRequest {
  templateId: string;
}
export type FillChecklistItemRequest = ChecklistEntryValue;
export interface OverrideChecklistItemRequest {
  reason: string;
}
export interface SignChecklistRequest {
  /** The signer's password or signing PIN, asked for again. */
  signature: string;
  /**
   * When the person signed on a tablet without a connection (ISO time, the tablet's clock), sent later from its outbox.
   * Stored beside the server's own time; not in the future, not before the checklist was started.
   */
  signedOnDeviceAt?: string;
}
export interface AmendChecklistRequest extends ChecklistEntryValue {
  itemKey: string;
  reason: string;
  /** Chief engineer only: required when the new value is out of range. */
  overrideReason?: string;
}

/** Photos on checklist items: these types only (checked by content), and the size limit the server reports. */
export const CHECKLIST_PHOTO_TYPES = ['image/png', 'image/jpeg', 'image/webp'] as const;

/** Start-gate reason codes of the checklist and qualification rules. */
export const GATE_REASON_CODES = {
  checklistMissing: 'checklist_missing',
  checklistUnsigned: 'checklist_unsigned',
  preLubeStale: 'pre_lube_stale',
  signerNotQualified: 'signer_not_qualified',
  qualificationMissing: 'qualification_missing',
  qualificationExpired: 'qualification_expired',
  shutdownChecklistMissing: 'shutdown_checklist_missing',
  shutdownChecklistUnsigned: 'shutdown_checklist_unsigned',
} as const;

/** Units of a checklist reading shown as people write them. */
const UNIT_WORDS: Record<string, string> = { degF: '°F', degC: '°C', 'pint/h': 'pt/h' };
export function checklistUnitText(unit: string | undefined): string {
  return unit ? (UNIT_WORDS[unit] ?? unit) : '';
}

/** True when a reading lies outside its acceptance range (both ends inclusive, either end may be open). */
export function readingOutOfRange(range: { min?: number | null; max?: number | null }, value: number): boolean {
  return (range.min != null && value < range.min) || (range.max != null && value > range.max);
}

/** "15 to 30 psig", "at least 15 psig", "at most 30 psig", or "" for an open range. */
export function acceptanceRangeText(item: { min?: number | null; max?: number | null; unit?: string }): string {
  const u = checklistUnitText(item.unit);
  const sp = u ? ` ${u}` : '';
  if (item.min != null && item.max != null) return `${item.min} to ${item.max}${sp}`;
  if (item.min != null) return `at least ${item.min}${sp}`;
  if (item.max != null) return `at most ${item.max}${sp}`;
  return '';
}
