import type { SessionUser, TokenPair } from '@crankjournal/shared-types';

/**
 * The signed-in session, kept in localStorage so a tablet survives a reload: the short-lived access token and who
 * is signed in. The refresh token never reaches the page: the server keeps it in an httpOnly cookie.
 */
export interface Session {
  accessToken: string;
  user: SessionUser;
}

const KEY = 'crankjournal.session';
type Listener = () => void;
const listeners = new Set<Listener>();
let current: Session | null = read();

function read(): Session | null {
  try {
    const raw = localStorage.getItem(KEY);
    if (!raw) return null;
    const { accessToken, user } = JSON.parse(raw) as Session;
    // A session stored by an earlier version also held a refresh token: written again without it.
    localStorage.setItem(KEY, JSON.stringify({ accessToken, user }));
    return { accessToken, user };
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
    current = pair ? { accessToken: pair.accessToken, user: pair.user } : null;
    if (current) localStorage.setItem(KEY, JSON.stringify(current));
    else localStorage.removeItem(KEY);
    listeners.forEach((l) => l());
  },
  updateUser(user: SessionUser) {
    if (!current) return;
    sessionStore.set({ ...current, user });
  },
};
