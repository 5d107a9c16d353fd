import { queryOptions, useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type {
  AmendBrakeFigureRequest,
  AmendCardRequest,
  AmendCardSetRequest,
  BrakeFigureDto,
  BrakeFigureInput,
  CardImageDto,
  CardInput,
  CardSetDto,
  CardSetPreviewDto,
  CreateCardSetRequest,
  IndicatedPowerRequest,
  IndicatedPowerResponse,
  TraceCalibrationRequest,
  TraceCalibrationResponse,
} from '@crankjournal/shared-types';
import { api } from '../../../api/http';
import { runKeys } from '../../runs/api/runs.api';

/** Keys sit under the run's own key, so refreshing a run (e.g. after a reconnect) refreshes its cards too. */
export const cardKeys = {
  sets: (runId: string) => [...runKeys.run(runId), 'card-sets'] as const,
  brakeFigures: (runId: string) => [...runKeys.run(runId), 'brake-figures'] as const,
  image: (imageId: string) => ['card-images', imageId] as const,
};

export const cardSetsQuery = (runId: string) =>
  queryOptions({ queryKey: cardKeys.sets(runId), queryFn: () => api<CardSetDto[]>(`/runs/${runId}/card-sets`) });
export const brakeFiguresQuery = (runId: string) =>
  queryOptions({ queryKey: cardKeys.brakeFigures(runId), queryFn: () => api<BrakeFigureDto[]>(`/runs/${runId}/brake-figures`) });

/** A card image as an object URL (the API needs the bearer token, so an <img src> cannot fetch it itself). */
export const cardImageQuery = (imageId: string) =>
  queryOptions({
    queryKey: cardKeys.image(imageId),
    queryFn: async () => {
      const res = await api<Response>(`/card-images/${imageId}`, { asResponse: true });
      return URL.createObjectURL(await res.blob());
    },
    staleTime: Infinity,
    gcTime: 10 * 60_000,
  });

export const previewCardSet = (runId: string, req: CreateCardSetRequest, signal?: AbortSignal) =>
  api<CardSetPreviewDto>(`/runs/${runId}/card-sets/preview`, { body: req, signal });
export const calibrateTrace = (req: TraceCalibrationRequest, signal?: AbortSignal) =>
  api<TraceCalibrationResponse>('/calculations/indicator-trace', { body: req, signal });
export const calculateIndicatedPower = (req: IndicatedPowerRequest) =>
  api<IndicatedPowerResponse>('/calculations/indicated-power', { body: req });

/** Sends the image file itself as the body; the server checks it by its content. */
export const uploadCardImage = (runId: string, file: Blob) =>
  api<CardImageDto>(`/runs/${runId}/card-images`, {
    method: 'POST',
    raw: file,
    headers: { 'content-type': file.type || 'application/octet-stream' },
  });

/** Puts a set into the run's list (new or changed), keeping the list in time order. */
export function upsertSet(list: CardSetDto[] | undefined, set: CardSetDto): CardSetDto[] | undefined {
  if (!list) return list;
  const i = list.findIndex((s) => s.id === set.id);
  const next = i === -1 ? [...list, set] : list.map((s) => (s.id === set.id ? set : s));
  return next.sort((a, b) => a.takenAt.localeCompare(b.takenAt) || a.createdAt.localeCompare(b.createdAt));
}
export function upsertBrakeFigure(list: BrakeFigureDto[] | undefined, f: BrakeFigureDto): BrakeFigureDto[] | undefined {
  if (!list) return list;
  const i = list.findIndex((x) => x.id === f.id);
  const next = i === -1 ? [...list, f] : list.map((x) => (x.id === f.id ? f : x));
  return next.sort((a, b) => a.measuredAt.localeCompare(b.measuredAt));
}
export function applySet(qc: QueryClient, set: CardSetDto) {
  qc.setQueryData<CardSetDto[]>(cardKeys.sets(set.runId), (old) => upsertSet(old, set));
}

export function useCreateCardSet(runId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (req: CreateCardSetRequest) => api<CardSetDto>(`/runs/${runId}/card-sets`, { body: req }),
    onSuccess: (s) => applySet(qc, s),
  });
}
export function useAddCard(setId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (req: CardInput) => api<CardSetDto>(`/card-sets/${setId}/cards`, { body: req }),
    onSuccess: (s) => applySet(qc, s),
  });
}
export function useAmendCard() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ cardId, req }: { cardId: string; req: AmendCardRequest }) =>
      api<CardSetDto>(`/cards/${cardId}/amendments`, { body: req }),
    onSuccess: (s) => applySet(qc, s),
  });
}
export function useAmendCardSet(setId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (req: AmendCardSetRequest) => api<CardSetDto>(`/card-sets/${setId}/amendments`, { body: req }),
    onSuccess: (s) => applySet(qc, s),
  });
}
export function useAddBrakeFigure(runId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (req: BrakeFigureInput) => api<BrakeFigureDto>(`/runs/${runId}/brake-figures`, { body: req }),
    onSuccess: (f) => {
      qc.setQueryData<BrakeFigureDto[]>(cardKeys.brakeFigures(runId), (old) => upsertBrakeFigure(old, f));
      void qc.invalidateQueries({ queryKey: cardKeys.sets(runId) });
    },
  });
}
export function useAmendBrakeFigure(runId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, req }: { id: string; req: AmendBrakeFigureRequest }) =>
      api<BrakeFigureDto>(`/brake-figures/${id}/amendments`, { body: req }),
    onSuccess: (f) => {
      qc.setQueryData<BrakeFigureDto[]>(cardKeys.brakeFigures(runId), (old) => upsertBrakeFigure(old, f));
      void qc.invalidateQueries({ queryKey: cardKeys.sets(runId) });
    },
  });
}
