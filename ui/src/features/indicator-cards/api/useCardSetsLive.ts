import { useEffect } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { CARD_RECORD_KINDS, type BrakeFigureDto, type CardSetDto, type RunRecordEvent } from '@crankjournal/shared-types';
import { getSocket, joinRoom, type LiveSocket } from '../../../api/socket';
import { applySet, cardKeys, upsertBrakeFigure } from './indicator-cards.api';

/** Whether this tab already listens to a room (the live run page may have joined it first). */
function alreadyJoined(socket: LiveSocket, room: string): boolean {
  return (socket as LiveSocket & { _rooms?: Set<string> })._rooms?.has(room) ?? false;
}

/**
 * Keeps a run's card sets and brake figures current from the live channel ('run:record' events of the
 * run's room). Joins the room unless the page already has; leaves it only if it joined it here.
 */
export function useCardSetsLive(runId: string) {
  const qc = useQueryClient();
  useEffect(() => {
    const socket = getSocket();
    if (!socket || !runId) return;
    const room = `run:${runId}`;
    // Decided after the page's own effects have run (a parent's effects run after its children's), so a
    // page that joins the room itself keeps it when this panel goes away.
    let leave = () => {};
    const timer = setTimeout(() => {
      leave = alreadyJoined(socket, room) ? () => {} : joinRoom(room);
    }, 0);
    const onRecord = (e: RunRecordEvent) => {
      if (e.runId !== runId || !e.data) return;
      if (e.kind === CARD_RECORD_KINDS.cardSet) applySet(qc, e.data as CardSetDto);
      if (e.kind === CARD_RECORD_KINDS.brakeFigure)
        qc.setQueryData<BrakeFigureDto[]>(cardKeys.brakeFigures(runId), (old) => upsertBrakeFigure(old, e.data as BrakeFigureDto));
    };
    // Events missed while disconnected: fetch again once back.
    const onConnect = () => void qc.invalidateQueries({ queryKey: cardKeys.sets(runId) });
    socket.on('run:record', onRecord);
    socket.on('connect', onConnect);
    return () => {
      socket.off('run:record', onRecord);
      socket.off('connect', onConnect);
      clearTimeout(timer);
      leave();
    };
  }, [runId, qc]);
}
