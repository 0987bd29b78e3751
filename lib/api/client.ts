/**
 * The browser's one way to call the API. `getJson` and `sendJson` resolve with the parsed body
 * or throw an `ApiError` carrying the server's error body (`{ error: { code, message, details? } }`)
 * and the HTTP status, so SWR hooks and mutations see one error type. `settle` turns a call into
 * `{ ok, data } | { ok: false, error }` for event handlers that branch instead of catching.
 * Client-safe: fetch only, no server imports.
 */

export type ApiErrorBody = { code: string; message: string; details?: Record<string, unknown> & { fields?: Record<string, string> } };

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details?: ApiErrorBody["details"];

  constructor(status: number, body: ApiErrorBody) {
    super(body.message);
    this.name = "ApiError";
    this.status = status;
    this.code = body.code;
    if (body.details !== undefined) this.details = body.details;
  }

  /** Messages keyed by field path, when the server named fields (422 `invalid-request`). */
  get fields(): Record<string, string> | undefined {
    return this.details?.fields;
  }

  /** The body the server sent, `{ error: { code, message, details? } }`. */
  get body(): { error: ApiErrorBody } {
    return { error: { code: this.code, message: this.message, ...(this.details !== undefined ? { details: this.details } : {}) } };
  }
}

export type Settled<T> = { ok: true; data: T } | { ok: false; error: ApiError };

const NETWORK: ApiErrorBody = { code: "network", message: "The server could not be reached; try again." };

async function call<T>(url: string, init: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { ...init, headers: { accept: "application/json", ...init.headers } });
  } catch {
    throw new ApiError(0, NETWORK);
  }
  const text = await res.text().catch(() => "");
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (res.ok) return body as T;
  const e = (body as { error?: Partial<ApiErrorBody> } | null)?.error;
  throw new ApiError(res.status, {
    code: typeof e?.code === "string" ? e.code : "http",
    message: typeof e?.message === "string" ? e.message : `Request failed (${res.status}).`,
    ...(e?.details !== undefined ? { details: e.details } : {}),
  });
}

/** GET a JSON resource; the fetcher of every SWR hook (keys are the URLs). */
export function getJson<T>(url: string): Promise<T> {
  return call<T>(url, { method: "GET" });
}

/** A write: the body is sent as JSON when given (a bodiless POST or DELETE sends none). */
export function sendJson<T = unknown>(method: "POST" | "PUT" | "PATCH" | "DELETE", url: string, body?: unknown): Promise<T> {
  return call<T>(url, body === undefined ? { method } : { method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
}

/** The outcome of a call as a value: `{ ok: true, data }`, or `{ ok: false, error }` with the `ApiError`. */
export async function settle<T>(pending: Promise<T>): Promise<Settled<T>> {
  try {
    return { ok: true, data: await pending };
  } catch (error) {
    return { ok: false, error: error instanceof ApiError ? error : new ApiError(0, { code: "client", message: error instanceof Error ? error.message : String(error) }) };
  }
}
