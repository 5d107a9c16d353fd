import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateLoggerRequest, IssuedLoggerKey, LoggerDto } from '@crankjournal/shared-types';
import { api } from '../../../api/http';

export const loggerKeys = {
  all: ['loggers'] as const,
  list: () => [...loggerKeys.all, 'list'] as const,
};

export const loggersListQuery = () => queryOptions({ queryKey: loggerKeys.list(), queryFn: () => api<LoggerDto[]>('/loggers') });
/** Issues a key for a new data logger; the key is in the answer once and never again. */
export const issueLoggerKey = (req: CreateLoggerRequest) => api<IssuedLoggerKey>('/loggers', { body: req });
export const revokeLogger = (id: string) => api<LoggerDto>(`/loggers/${id}/revoke`, { method: 'POST' });

export function useIssueLoggerKey() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: issueLoggerKey, onSuccess: () => qc.invalidateQueries({ queryKey: loggerKeys.all }) });
}
export function useRevokeLogger() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: revokeLogger, onSuccess: () => qc.invalidateQueries({ queryKey: loggerKeys.all }) });
}
