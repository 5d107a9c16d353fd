import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { LotMoney, OutstandingLot, PaymentAskRequest, PaymentRefundRequest } from '@crankjournal/shared-types';
import { api } from '../../../api/http';

/** Keys: everything about money sits under ['payments']. */
export const paymentKeys = {
  all: ['payments'] as const,
  lot: (lotId: string) => [...paymentKeys.all, 'lot', lotId] as const,
  outstanding: () => [...paymentKeys.all, 'outstanding'] as const,
};

/**
 * A payment's news comes through the live channel (useMoneyLive). Only while the channel is down and money is asked
 * (the customer may pay at any moment) is the lot's money asked again, slowly.
 */
export const OFFLINE_POLL_MS = 15_000;

export const lotMoneyQuery = (lotId: string, opts: { live: boolean } = { live: true }) =>
  queryOptions({
    queryKey: paymentKeys.lot(lotId),
    queryFn: () => api<LotMoney>(`/payments/lots/${lotId}`),
    refetchInterval: (q) => (!opts.live && q.state.data?.payments.some((p) => p.state === 'asked') ? OFFLINE_POLL_MS : false),
  });

export const outstandingQuery = () =>
  queryOptions({ queryKey: paymentKeys.outstanding(), queryFn: () => api<OutstandingLot[]>('/payments/outstanding') });

function useMoneyMutation<T>(fn: (req: T) => Promise<LotMoney>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: (m) => {
      qc.setQueryData(paymentKeys.lot(m.lotId), m);
      void qc.invalidateQueries({ queryKey: paymentKeys.all });
      void qc.invalidateQueries({ queryKey: ['mill', 'lots'] });
    },
  });
}

export const useAskPayment = (lotId: string) =>
  useMoneyMutation((req: PaymentAskRequest) => api<LotMoney>(`/payments/lots/${lotId}/requests`, { body: req }));
export const useRefund = () =>
  useMoneyMutation(({ paymentId, req }: { paymentId: string; req: PaymentRefundRequest }) =>
    api<LotMoney>(`/payments/${paymentId}/refunds`, { body: req }),
  );
