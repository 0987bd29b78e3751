/** Browser-side JSON calls to the API, answering with the error shape instead of throwing. */
export type ApiFailure = { status: number; code: string; message: string; fields?: Record<string, string> };
export type ApiAnswer<T> = { ok: true; data: T } | { ok: false; error: ApiFailure };

export async function sendJson<T>(method: "POST" | "PATCH", url: string, body: unknown): Promise<ApiAnswer<T>> {
  let res: Response;
  try {
    res = await fetch(url, { method, headers: { "content-type": "application/json", accept: "application/json" }, body: JSON.stringify(body) });
  } catch {
    return { ok: false, error: { status: 0, code: "network", message: "The server could not be reached; try again." } };
  }
  const json = await res.json().catch(() => null);
  if (res.ok) return { ok: true, data: json as T };
  const e = json?.error ?? {};
  return { ok: false, error: { status: res.status, code: e.code ?? "http", message: e.message ?? `Request failed (${res.status}).`, fields: e.details?.fields } };
}
