/**
 * The live channel's events, typed once for both the server (socket.io gateway) and the UI.
 * Rooms: `site` (everyone signed in), `run:<id>`, `engine:<id>`.
 */
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
}
export interface LiveErrorEvent {
  event: string;
  message: string | string[];
}

export interface ServerToClientEvents {
  'site:notice': (notice: SiteNotice) => void;
  'live:error': (error: LiveErrorEvent) => void;
}

export interface ClientToServerEvents {
  'room:join': (req: JoinRoomRequest, ack?: (res: JoinRoomAck) => void) => void;
  'room:leave': (req: JoinRoomRequest, ack?: (res: JoinRoomAck) => void) => void;
}
