/** Calls the participant's own session API; the token in the path is the only credential. */
export async function postSession(token: string, path: string, body: unknown): Promise<Response> {
  return fetch(`/api/session/${encodeURIComponent(token)}/${path}`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify(body),
    credentials: "omit",
    cache: "no-store",
  });
}

/** The error message of a JSON error response, or a plain fallback. */
export async function errorMessage(res: Response): Promise<string> {
  try {
    const body = (await res.json()) as { error?: { message?: string } };
    return body.error?.message ?? `The server answered ${res.status}.`;
  } catch {
    return `The server answered ${res.status}.`;
  }
}
