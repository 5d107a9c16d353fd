import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  GrantQualificationRequest,
  QualificationDto,
  QualificationMatrix,
  RenewQualificationRequest,
} from '@crankjournal/shared-types';
import { api, withQuery } from '../../../api/http';

export const qualificationKeys = {
  all: ['qualifications'] as const,
  mine: () => [...qualificationKeys.all, 'mine'] as const,
  matrix: (engineId: string) => [...qualificationKeys.all, 'matrix', engineId] as const,
  history: (userId: string, engineId: string) => [...qualificationKeys.all, 'history', userId, engineId] as const,
};

export const myQualificationsQuery = () =>
  queryOptions({ queryKey: qualificationKeys.mine(), queryFn: () => api<QualificationDto[]>('/qualifications/mine') });
export const qualificationMatrixQuery = (engineId: string) =>
  queryOptions({
    queryKey: qualificationKeys.matrix(engineId),
    queryFn: () => api<QualificationMatrix>(withQuery('/qualifications/matrix', { engineId })),
  });
export const qualificationHistoryQuery = (userId: string, engineId: string) =>
  queryOptions({
    queryKey: qualificationKeys.history(userId, engineId),
    queryFn: () => api<QualificationDto[]>(withQuery('/qualifications', { userId, engineId, includeWithdrawn: true })),
  });

export function useQualificationWrite() {
  const qc = useQueryClient();
  const onSuccess = () => qc.invalidateQueries({ queryKey: qualificationKeys.all });
  return {
    grant: useMutation({
      mutationFn: (req: GrantQualificationRequest) => api<QualificationDto>('/qualifications', { body: req }),
      onSuccess,
    }),
    renew: useMutation({
      mutationFn: ({ id, req }: { id: string; req: RenewQualificationRequest }) =>
        api<QualificationDto>(`/qualifications/${id}/renew`, { body: req }),
      onSuccess,
    }),
    withdraw: useMutation({
      mutationFn: ({ id, reason }: { id: string; reason: string }) =>
        api<QualificationDto>(`/qualifications/${id}/withdraw`, { body: { reason } }),
      onSuccess,
    }),
  };
}
