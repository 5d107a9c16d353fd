import { queryOptions } from '@tanstack/react-query';
import type { InviteUserRequest, MailJobDto, UpdateUserRequest, UserSummary } from '@crankjournal/shared-types';
import { api } from '../../../api/http';

export const userKeys = {
  all: ['users'] as const,
  list: () => [...userKeys.all, 'list'] as const,
};

export const usersListQuery = () => queryOptions({ queryKey: userKeys.list(), queryFn: () => api<UserSummary[]>('/users') });
export const inviteUser = (req: InviteUserRequest) => api<UserSummary>('/users/invitations', { body: req });
export const updateUser = (id: string, req: UpdateUserRequest) => api<UserSummary>(`/users/${id}`, { method: 'PATCH', body: req });

export const mailKeys = {
  all: ['mail'] as const,
  jobs: () => [...mailKeys.all, 'jobs'] as const,
};
/** The outgoing e-mail queue (administrator); refreshed every 10 s while shown. */
export const mailJobsQuery = () =>
  queryOptions({ queryKey: mailKeys.jobs(), queryFn: () => api<MailJobDto[]>('/mail/jobs'), refetchInterval: 10_000 });
