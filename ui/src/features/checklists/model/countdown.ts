/** What is left of the pre-lube window at `nowMs`: "12:05" (min:s) or "1:02:05" (h:min:s); zero once it has passed. */
export function countdown(untilIso: string, nowMs: number): { remainingMs: number; text: string; expired: boolean } {
  const remainingMs = Math.max(0, Date.parse(untilIso) - nowMs);
  const total = Math.ceil(remainingMs / 1000);
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const two = (n: number) => String(n).padStart(2, '0');
  return { remainingMs, text: h > 0 ? `${h}:${two(m)}:${two(s)}` : `${m}:${two(s)}`, expired: remainingMs === 0 };
}

/** "43 min ago", "2 h 05 min ago" — how long ago an instant was. */
export function agoText(iso: string, nowMs: number): string {
  const min = Math.max(0, Math.floor((nowMs - Date.parse(iso)) / 60_000));
  if (min < 1) return 'just now';
  if (min < 60) return `${min} min ago`;
  return `${Math.floor(min / 60)} h ${String(min % 60).padStart(2, '0')} min ago`;
}
