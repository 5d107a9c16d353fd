import { io, type Socket } from 'socket.io-client';
import { tokenOf, type Who } from './signed-in.js';

/**
 * A socket.io client of the app at `url` as `who` (no token at all without one): websocket only, no
 * reconnection, a connection of its own. Pass `autoConnect: false` to attach listeners before connecting.
 */
export function socketAs(url: string, who?: Who, opts: { autoConnect?: boolean } = {}): Socket {
  return io(url, {
    transports: ['websocket'],
    reconnection: false,
    forceNew: true,
    ...opts,
    ...(who ? { auth: { token: tokenOf(who) } } : {}),
  });
}

/** Resolves once `s` is connected (connecting it first if it was made with autoConnect off); rejects with its connect_error. */
export function connected(s: Socket): Promise<Socket> {
  return new Promise<Socket>((resolve, reject) => {
    s.once('connect', () => resolve(s));
    s.once('connect_error', reject);
    if (!s.active) s.connect();
  });
}
