import { io, type Socket } from 'socket.io-client';
import type { ClientToServerEvents, ServerToClientEvents } from '@crankjournal/shared-types';
import { sessionStore } from './session';

export type LiveSocket = Socket<ServerToClientEvents, ClientToServerEvents>;
let socket: LiveSocket | null = null;
let tokenUsed: string | null = null;

/** One live connection per tab, authenticated with the current access token; rooms rejoined on reconnect. */
export function getSocket(): LiveSocket | null {
  const s = sessionStore.get();
  if (!s) {
    socket?.disconnect();
    socket = null;
    return null;
  }
  if (socket && tokenUsed === s.accessToken) return socket;
  if (socket) {
    // Token refreshed: update the handshake for the next reconnect.
    socket.auth = { token: s.accessToken };
    tokenUsed = s.accessToken;
    return socket;
  }
  tokenUsed = s.accessToken;
  // WebSocket only: every event of a connection reaches the same instance, so several instances behind a proxy need
  // no sticky sessions (long-polling would send each request of one connection to any instance).
  socket = io({ path: '/socket.io', auth: { token: s.accessToken }, transports: ['websocket'] });
  const rooms = new Set<string>();
  (socket as LiveSocket & { _rooms?: Set<string> })._rooms = rooms;
  socket.on('connect', () => rooms.forEach((room) => socket?.emit('room:join', { room })));
  socket.on('connect_error', () => {
    const cur = sessionStore.get();
    if (cur && socket) socket.auth = { token: cur.accessToken };
  });
  return socket;
}

/** Joins a room now and after every reconnect; returns a function that leaves it. */
export function joinRoom(room: string): () => void {
  const s = getSocket();
  if (!s) return () => {};
  const rooms = (s as LiveSocket & { _rooms?: Set<string> })._rooms!;
  rooms.add(room);
  if (s.connected) s.emit('room:join', { room });
  return () => {
    rooms.delete(room);
    if (s.connected) s.emit('room:leave', { room });
  };
}

export function closeSocket() {
  socket?.disconnect();
  socket = null;
  tokenUsed = null;
}
