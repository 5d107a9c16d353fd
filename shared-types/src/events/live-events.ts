/**
 * The live channel's events, typed once for both the server (socket.io gateway) and the UI.
 * Rooms: `site` (everyone signed in), `run:<id>`, `engine:<id>`, `administration`, `money` (MONEY_READERS only).
 */
import type { AlarmDto, IngestResult, ReadingDto, RunDetail, StartGateVerdict, ReadingInput } from '../api/runs.js';
import type { LotMoney } from '../api/payments.js';

/**
 * The room of customer lots' money: `lot:money` (a lot's money after a payment is asked, paid, declined, expired or
 * refunded) goes only there. Only the roles that see money (MONEY_READERS) may join it.
 */
export const MONEY_ROOM = 'money';

export interface SiteNotice {
  message: string;
  from: string;
  at: string;
}
export interface JoinRoomRequest {
  room: string;
}
export interface JoinRoomAck {
  ok: boolean;
  room?: string;
  error?: string;
  /** On refusal: 403 when the role may not join, 404 when there is no such room, 400 for a malformed request. */
  status?: number;
}
export interface LiveErrorEvent {
  event: string;
  message: string | string[];
  status?: number;
}
export interface ReadingsEvent {
  runId: string;
  readings: ReadingDto[];
}
export interface SubmitReadingsRequest {
  runId: string;
  readings: ReadingInput[];
}
export interface StartRunRequest {
  runId: string;
}
export interface LiveAck<T> {
  ok: boolean;
  error?: string;
  status?: number;
  data?: T;
  details?: unknown;
}
/** A generic "something changed in this run" event for feature areas (card sets, checklists, passes). */
export interface RunRecordEvent {
  runId: string;
  kind: string;
  id: string;
  data?: unknown;
}

export interface ServerToClientEvents {
  'site:notice': (notice: SiteNotice) => void;
  'live:error': (error: LiveErrorEvent) => void;
  'readings:new': (e: ReadingsEvent) => void;
  'reading:amended': (r: ReadingDto) => void;
  'alarm:changed': (a: AlarmDto) => void;
  'run:changed': (r: RunDetail) => void;
  'run:record': (e: RunRecordEvent) => void;
  /** In MONEY_ROOM: a lot's money as GET /api/payments/lots/:id answers it, whenever a payment changes it. */
  'lot:money': (m: LotMoney) => void;
}

export interface ClientToServerEvents {
  'room:join': (req: JoinRoomRequest, ack?: (res: JoinRoomAck) => void) => void;
  'room:leave': (req: JoinRoomRequest, ack?: (res: JoinRoomAck) => void) => void;
  'readings:submit': (req: SubmitReadingsRequest, ack?: (res: LiveAck<IngestResult>) => void) => void;
  'run:start': (req: StartRunRequest, ack?: (res: LiveAck<RunDetail | StartGateVerdict>) => void) => void;
}
