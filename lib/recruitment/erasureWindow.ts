/**
 * Until when a participant may ask for erasure (erasureDeadline): the window the consent text
 * states, in days, counted from the end of their session (completion, else withdrawal, else the
 * last activity); no window stated means no deadline. Calendar arithmetic in UTC milliseconds
 * (a day is 86 400 000 ms: ECMAScript Date, ECMA-262 §21.4.1).
 * Cost: O(1). @throws never.
 * @example erasureDeadline(30, new Date("2026-03-01T10:00:00Z"))?.toISOString() // "2026-03-31T10:00:00.000Z"
 */
export function erasureDeadline(windowDays: number | null, sessionEnd: Date | null): Date | null {
  if (windowDays === null || sessionEnd === null) return null;
  return new Date(sessionEnd.getTime() + windowDays * 86_400_000);
}
