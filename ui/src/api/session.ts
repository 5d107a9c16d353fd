import type { SessionUser, TokenPair } from '@crankjournal/shared-types';

/** The signed-in session, kept in localStorage so a tablet survives a reload. */
export interface Session {
  accessToken: string;
  refreshToken: string;
  user: SessionUser;
}

const KEY = 'crankjournal.session';
type Listener = () => void;
const listeners = new Set<Listener>();
let current: Session | null = read();

function read(): Session | null {
  try {
    const raw = localStorage.getItem(KEY);
    return raw ? (JSON.parse(raw) as Session) : null;
  } catch {
    return null;
  }
}

export const sessionStore = {
  get: () => current,
  subscribe(l: Listener) {
    listeners.add(l);
    return () => listeners.delete(l);
  },
  set(pair: TokenPair | Session | null) {
    current = pair ? { accessToken: pair.accessToken, refreshToken: pair.refreshToken, user: pair.user } : null;
    if (current) localStorage.setItem(KEY, JSON.stringify(current));
    else localStorage.removeItem(KEY);
    listeners.forEach((l) => l());
  },
  updateUser(user: SessionUser) {
    if (!current) return;
    sessionStore.set({ ...current, user });
  },
};
