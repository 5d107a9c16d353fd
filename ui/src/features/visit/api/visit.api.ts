import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { io, type Socket } from 'socket.io-client';
import type {
  CreateVisitorBoardRequest,
  UpdateVisitorBoardRequest,
  VisitorBoardDto,
  VisitorBoardView,
  VisitServerToClientEvents,
} from '@crankjournal/shared-types';
import { api } from '../../../api/http';

export const visitKeys = {
  all: ['visit'] as const,
  boards: () => [...visitKeys.all, 'boards'] as const,
  board: (id: string) => [...visitKeys.boards(), id] as const,
  publicView: (slug: string) => [...visitKeys.all, 'public', slug] as const,
};

// The chief engineer's side.
export const visitorBoardsQuery = () =>
  queryOptions({ queryKey: visitKeys.boards(), queryFn: () => api<VisitorBoardDto[]>('/visitor-boards') });

function useBoardMutation<A>(fn: (a: A) => Promise<VisitorBoardDto>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => qc.invalidateQueries({ queryKey: visitKeys.boards() }) });
}
export const useCreateVisitorBoard = () =>
  useBoardMutation((req: CreateVisitorBoardRequest) => api<VisitorBoardDto>('/visitor-boards', { method: 'POST', body: req }));
export const useUpdateVisitorBoard = () =>
  useBoardMutation(({ id, ...req }: UpdateVisitorBoardRequest & { id: string }) =>
    api<VisitorBoardDto>(`/visitor-boards/${id}`, { method: 'PATCH', body: req }),
  );
export const useChangeSlug = () => useBoardMutation((id: string) => api<VisitorBoardDto>(`/visitor-boards/${id}/slug`, { method: 'POST' }));
export const useUploadPhoto = () =>
  useBoardMutation(({ id, file }: { id: string; file: File }) =>
    api<VisitorBoardDto>(`/visitor-boards/${id}/photo`, {
      method: 'PUT',
      raw: file,
      headers: { 'content-type': file.type || 'image/jpeg' },
    }),
  );
export const useRemovePhoto = () =>
  useBoardMutation((id: string) => api<VisitorBoardDto>(`/visitor-boards/${id}/photo`, { method: 'DELETE' }));

// The visitors' side: no sign-in.
export const visitViewQuery = (slug: string) =>
  queryOptions({
    queryKey: visitKeys.publicView(slug),
    queryFn: () => api<VisitorBoardView>(`/visit/${encodeURIComponent(slug)}`),
    retry: false,
  });

export type VisitSocket = Socket<VisitServerToClientEvents, Record<string, never>>;

/** The public /visit namespace for one board; socket.io reconnects by itself (a wall display left alone all day). */
export function openVisitSocket(slug: string): VisitSocket {
  return io('/visit', { path: '/socket.io', auth: { slug }, transports: ['websocket', 'polling'], reconnectionDelayMax: 10_000 });
}
