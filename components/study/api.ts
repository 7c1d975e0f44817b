/** Calls one of the JSON routes from a client component; throws an Error with the server's message and keeps the issues. */
export class ApiError extends Error {
  constructor(message: string, readonly status: number, readonly issues: { path: string; message: string }[]) {
    super(message);
  }
}

export async function apiSend<T>(method: string, url: string, body?: unknown): Promise<T> {
  const res = await fetch(url, { method, headers: body === undefined ? {} : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
  if (!res.ok) {
    const j = (await res.json().catch(() => null)) as { error?: { message?: string; issues?: { path: string; message: string }[] } } | null;
    throw new ApiError(j?.error?.message ?? `The server answered ${res.status}.`, res.status, j?.error?.issues ?? []);
  }
  return (await res.json()) as T;
}
