/**
 * Wait before the next upload attempt (retryDelayMs).
 *
 * Purpose: exponential backoff with jitter, so many clients coming back online do not retry in
 * step: min(cap, base·2^attempt) scaled by a factor in [0.5, 1). Source: common practice
 * ("exponential backoff and jitter"). Cost: O(1).
 * @throws never.
 * @example retryDelayMs(3, 0) // 4000
 */
export function retryDelayMs(attempt: number, random: number, baseMs = 1000, capMs = 30_000): number {
  const raw = Math.min(capMs, baseMs * 2 ** Math.max(0, attempt));
  return Math.round(raw * (0.5 + 0.5 * Math.min(Math.max(random, 0), 1)));
}

/** What the queue does with a batch after a response (or a network failure: status 0). */
export type UploadOutcome = "stored" | "refused" | "stop" | "retry";

/**
 * The queue's decision for a response status (uploadOutcome).
 *
 * Purpose: 2xx (stored, or a duplicate) removes the batch from the queue; 422 (malformed or
 * implausible) keeps it, marked refused, and never retries it; 410 (withdrawn) or 404 (unknown
 * session) stops the queue; anything else (network down, 5xx, 429, 408) retries with backoff.
 * Source: RFC 9110 status semantics; the project's upload contract. Cost: O(1).
 * @throws never.
 * @example uploadOutcome(422) // "refused"
 */
export function uploadOutcome(status: number): UploadOutcome {
  if (status >= 200 && status < 300) return "stored";
  if (status === 422 || status === 400 || status === 413) return "refused";
  if (status === 410 || status === 404) return "stop";
  return "retry";
}
