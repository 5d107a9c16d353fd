import { useCallback } from 'react';
import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AmendChecklistRequest,
  ChecklistDetail,
  ChecklistTemplateContent,
  ChecklistTemplateDetail,
  ChecklistTemplateSummary,
  ChecklistTemplateVersionDto,
  CreateChecklistTemplateRequest,
  FillChecklistItemRequest,
  RunChecklistsOverview,
} from '@crankjournal/shared-types';
import { api, withQuery, download } from '../../../api/http';
import { outbox } from '../../../api/outbox';
import { runKeys } from '../../runs/api/runs.api';

/** Keys: a run's checklists sit under the run's key, so a run refresh takes them too; templates under ['checklist-templates']. */
export const checklistKeys = {
  runOverview: (runId: string) => [...runKeys.run(runId), 'checklists'] as const,
  checklist: (id: string) => ['checklists', id] as const,
  templates: ['checklist-templates'] as const,
  templateList: (engineId?: string) => [...checklistKeys.templates, 'list', { engineId: engineId ?? null }] as const,
  template: (id: string) => [...checklistKeys.templates, id] as const,
  templateVersion: (id: string, version: number) => [...checklistKeys.template(id), 'version', version] as const,
};

export const runChecklistsQuery = (runId: string) =>
  queryOptions({ queryKey: checklistKeys.runOverview(runId), queryFn: () => api<RunChecklistsOverview>(`/runs/${runId}/checklists`) });
export const checklistQuery = (id: string) =>
  queryOptions({ queryKey: checklistKeys.checklist(id), queryFn: () => api<ChecklistDetail>(`/checklists/${id}`) });
export const templatesQuery = (engineId?: string) =>
  queryOptions({
    queryKey: checklistKeys.templateList(engineId),
    queryFn: () => api<ChecklistTemplateSummary[]>(withQuery('/checklist-templates', { engineId })),
  });
export const templateQuery = (id: string) =>
  queryOptions({ queryKey: checklistKeys.template(id), queryFn: () => api<ChecklistTemplateDetail>(`/checklist-templates/${id}`) });
export const templateVersionQuery = (id: string, version: number) =>
  queryOptions({
    queryKey: checklistKeys.templateVersion(id, version),
    queryFn: () => api<ChecklistTemplateVersionDto>(`/checklist-templates/${id}/versions/${version}`),
    staleTime: Infinity,
  });

export const downloadBlankChecklist = (templateId: string, version?: number) =>
  download(
    version ? `/checklist-templates/${templateId}/versions/${version}/blank.pdf` : `/checklist-templates/${templateId}/blank.pdf`,
    'checklist.pdf',
  );

/** The photo of an item, as an object URL for an <img> (the API needs the access token). */
export async function fetchPhotoUrl(checklistId: string, itemKey: string): Promise<string> {
  const res = await api<Response>(`/checklists/${checklistId}/items/${itemKey}/photo`, { asResponse: true });
  return URL.createObjectURL(await res.blob());
}

/** Puts a changed checklist into the cache and refreshes the run's overview and start gate. */
export function useApplyChecklist() {
  const qc = useQueryClient();
  return useCallback(
    (c: ChecklistDetail) => {
      qc.setQueryData(checklistKeys.checklist(c.id), c);
      void qc.invalidateQueries({ queryKey: checklistKeys.runOverview(c.runId) });
      void qc.invalidateQueries({ queryKey: runKeys.startGate(c.runId) });
      void qc.invalidateQueries({ queryKey: runKeys.detail(c.runId) });
    },
    [qc],
  );
}

export function useStartChecklist(runId: string) {
  const apply = useApplyChecklist();
  return useMutation({
    mutationFn: (templateId: string) => api<ChecklistDetail>(`/runs/${runId}/checklists`, { body: { templateId } }),
    onSuccess: apply,
  });
}

export type ChecklistAction =
  | { kind: 'fill'; itemKey: string; value: FillChecklistItemRequest }
  | { kind: 'photo'; itemKey: string; file: Blob }
  | { kind: 'override'; itemKey: string; reason: string }
  | { kind: 'sign'; signature: string }
  | { kind: 'amend'; request: AmendChecklistRequest };

/** Where an entry or photo kept on the tablet belongs, and what the person reads about it. */
export interface ChecklistContext {
  runId: string;
  itemLabel: string;
  /** The checklist's name (for a signature kept on the tablet). */
  name?: string;
}

/**
 * A signature: sent now, or kept on the tablet when the server cannot be reached (then null) with the time it was
 * signed there; the password stays in this tab's memory only. The start gate counts it once the server has it.
 */
async function signOrQueue(id: string, signature: string, ctx: ChecklistContext): Promise<ChecklistDetail | null> {
  const o = await outbox().submitRequest<ChecklistDetail>(
    {
      kind: 'checklist-sign',
      label: ctx.name ? `Signature on “${ctx.name}”` : 'Checklist signature',
      runId: ctx.runId,
      path: `/checklists/${id}/sign`,
      method: 'POST',
      body: {},
      whenQueued: { signedOnDeviceAt: new Date().toISOString() },
      secretField: 'signature',
      ref: { checklistId: id },
    },
    signature,
  );
  return o.kind === 'sent' ? o.result : null;
}

/** An entry or photo: sent now, or kept on the tablet when the server cannot be reached (then null). */
async function sendOrQueue(
  id: string,
  itemKey: string,
  ctx: ChecklistContext,
  req: { kind: 'checklist-entry'; body: FillChecklistItemRequest } | { kind: 'checklist-photo'; blob: Blob },
): Promise<ChecklistDetail | null> {
  const photo = req.kind === 'checklist-photo';
  const o = await outbox().submitRequest<ChecklistDetail>({
    ...req,
    label: `${photo ? 'Photo for' : 'Checklist item'} “${ctx.itemLabel}”`,
    runId: ctx.runId,
    path: `/checklists/${id}/items/${itemKey}${photo ? '/photo' : ''}`,
    method: 'PUT',
    contentType: photo ? req.blob.type || 'application/octet-stream' : undefined,
    ref: { checklistId: id, itemKey },
  });
  return o.kind === 'sent' ? o.result : null;
}

/** Fill and photo go through the outbox when a context is given (they are puts of one item: a resend stores once). */
export function checklistAction(id: string, a: ChecklistAction, ctx?: ChecklistContext): Promise<ChecklistDetail | null> {
  switch (a.kind) {
    case 'fill':
      if (ctx) return sendOrQueue(id, a.itemKey, ctx, { kind: 'checklist-entry', body: a.value });
      return api(`/checklists/${id}/items/${a.itemKey}`, { method: 'PUT', body: a.value });
    case 'photo':
      if (ctx) return sendOrQueue(id, a.itemKey, ctx, { kind: 'checklist-photo', blob: a.file });
      return api(`/checklists/${id}/items/${a.itemKey}/photo`, {
        method: 'PUT',
        raw: a.file,
        headers: { 'content-type': a.file.type || 'application/octet-stream' },
      });
    case 'override':
      return api(`/checklists/${id}/items/${a.itemKey}/override`, { body: { reason: a.reason } });
    case 'sign':
      if (ctx) return signOrQueue(id, a.signature, ctx);
      return api(`/checklists/${id}/sign`, { body: { signature: a.signature } });
    case 'amend':
      return api(`/checklists/${id}/amendments`, { body: a.request });
  }
}

/** A checklist action; with `runId`, entries and photos are kept on the tablet when the server cannot be reached (null). */
export function useChecklistAction(id: string, runId?: string, name?: string) {
  const apply = useApplyChecklist();
  return useMutation({
    mutationFn: (a: ChecklistAction & { itemLabel?: string }) =>
      checklistAction(id, a, runId ? { runId, name, itemLabel: a.itemLabel ?? ('itemKey' in a ? a.itemKey : '') } : undefined),
    onSuccess: (c: ChecklistDetail | null) => c && apply(c),
  });
}

export function useTemplateWrite() {
  const qc = useQueryClient();
  const done = (t: ChecklistTemplateDetail) => {
    qc.setQueryData(checklistKeys.template(t.id), t);
    void qc.invalidateQueries({ queryKey: [...checklistKeys.templates, 'list'] });
  };
  return {
    create: useMutation({
      mutationFn: (req: CreateChecklistTemplateRequest) => api<ChecklistTemplateDetail>('/checklist-templates', { body: req }),
      onSuccess: done,
    }),
    saveDraft: useMutation({
      mutationFn: ({ id, content }: { id: string; content: ChecklistTemplateContent }) =>
        api<ChecklistTemplateDetail>(`/checklist-templates/${id}/draft`, { method: 'PUT', body: content }),
      onSuccess: done,
    }),
    discardDraft: useMutation({
      mutationFn: (id: string) => api<ChecklistTemplateDetail>(`/checklist-templates/${id}/draft`, { method: 'DELETE' }),
      onSuccess: done,
    }),
    issue: useMutation({
      mutationFn: ({ id, changeNote }: { id: string; changeNote: string }) =>
        api<ChecklistTemplateDetail>(`/checklist-templates/${id}/issue`, { body: { changeNote } }),
      onSuccess: done,
    }),
    withdraw: useMutation({
      mutationFn: ({ id, withdrawn }: { id: string; withdrawn: boolean }) =>
        api<ChecklistTemplateDetail>(`/checklist-templates/${id}/${withdrawn ? 'withdraw' : 'reissue'}`, { method: 'POST' }),
      onSuccess: done,
    }),
  };
}
