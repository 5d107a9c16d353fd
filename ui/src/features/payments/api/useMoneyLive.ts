import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { MONEY_ROOM, type LotMoney } from '@crankjournal/shared-types';
import { getSocket, joinRoom, type LiveSocket } from '../../../api/socket';
import { paymentKeys } from './payments.api';

function alreadyJoined(socket: LiveSocket, room: string): boolean {
  return (socket as LiveSocket & { _rooms?: Set<string> })._rooms?.has(room) ?? false;
}

/**
 * Keeps the money of customer lots current from the live channel: joins the money room (only the roles that see
 * money may), puts each `lot:money` into the lot's query and asks the outstanding list again. After a reconnect
 * everything about money is asked again (events may have been missed). Returns whether the channel is connected;
 * while it is not, the queries fall back to a slow poll (lotMoneyQuery).
 */
export function useMoneyLive(enabled: boolean): { connected: boolean } {
  const qc = useQueryClient();
  const [connected, setConnected] = useState(() => getSocket()?.connected ?? false);
  useEffect(() => {
    const socket = enabled ? getSocket() : null;
    if (!socket) return;
    const leave = alreadyJoined(socket, MONEY_ROOM) ? () => {} : joinRoom(MONEY_ROOM);
    let missed = !socket.connected;
    const onMoney = (m: LotMoney) => {
      qc.setQueryData(paymentKeys.lot(m.lotId), m);
      void qc.invalidateQueries({ queryKey: paymentKeys.outstanding() });
    };
    const onConnect = () => {
      setConnected(true);
      if (missed) void qc.invalidateQueries({ queryKey: paymentKeys.all });
      missed = false;
    };
    const onDisconnect = () => {
      setConnected(false);
      missed = true;
    };
    socket.on('lot:money', onMoney);
    socket.on('connect', onConnect);
    socket.on('disconnect', onDisconnect);
    setConnected(socket.connected);
    return () => {
      socket.off('lot:money', onMoney);
      socket.off('connect', onConnect);
      socket.off('disconnect', onDisconnect);
      leave();
    };
  }, [enabled, qc]);
  return { connected: enabled && connected };
}
