import { ZodError, type ZodType } from "zod";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { idParamSchema } from "@/lib/validation/params";

export type ErrorBody = { error: { code: string; message: string; details?: unknown } };

/** API answers are per user and per moment: never stored by a browser or a proxy. */
export const NO_STORE = "no-store";

function noStore(headers?: HeadersInit): Headers {
  const h = new Headers(headers);
  if (!h.has("cache-control")) h.set("cache-control", NO_STORE);
  return h;
}

export function errorResponse(status: number, code: string, message: string, details?: unknown, headers?: HeadersInit): Response {
  const body: ErrorBody = { error: details === undefined ? { code, message } : { code, message, details } };
  return Response.json(body, { status, headers: noStore(headers) });
}

export function json(data: unknown, status = 200, headers?: HeadersInit): Response {
  return Response.json(data, { status, headers: noStore(headers) });
}

/** An answer already serialised (JSON text, or its UTF-8 bytes from the engine pool), sent as `json` would send it. */
export function jsonBody(body: string | Uint8Array<ArrayBuffer>, status = 200, headers?: HeadersInit): Response {
  const h = noStore(headers);
  h.set("content-type", "application/json");
  return new Response(body, { status, headers: h });
}

/** zod issues as `{ path: message }`, the shape forms and API clients both read. */
export function fieldErrors(error: ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    // An unknown field is reported at its own name, so a client sees which key to drop.
    const keys = issue.code === "unrecognized_keys" ? issue.keys.map((k) => [...issue.path, k].join(".")) : [issue.path.join(".") || "_"];
    for (const key of keys) if (!(key in out)) out[key] = issue.message;
  }
  return out;
}

export function validationError(error: ZodError): AppError {
  const fields = fieldErrors(error);
  const first = error.issues[0];
  // An unknown field's message names it; its path is the object that holds it.
  const message = !first ? "Invalid request." : first.path.length ? `${first.path.join(".")}: ${first.message}` : first.message;
  return new AppError(422, "invalid-request", message, { fields });
}

/**
 * Read a JSON body, stopping at the size limit: route handlers have no cap of
 * their own, and a streamed body may not say its length.
 */
export async function readJson<T>(request: Request, schema: ZodType<T>, limitBytes = env.BODY_LIMIT_BYTES): Promise<T> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^application\/json\b/i.test(type)) {
    throw new AppError(415, "unsupported-media-type", "Send the body as application/json.");
  }
  const declared = Number(request.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > limitBytes) throw tooLarge(limitBytes);
  const text = await readText(request, limitBytes);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new AppError(400, "malformed-json", "The body is not valid JSON.");
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

const tooLarge = (limit: number) => new AppError(413, "body-too-large", `The body is larger than the ${Math.round(limit / 1024)} KiB limit.`);

async function readText(request: Request, limitBytes: number): Promise<string> {
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limitBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(limitBytes);
    }
    chunks.push(value);
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(Buffer.concat(chunks));
  } catch {
    throw new AppError(400, "malformed-json", "The body is not valid UTF-8.");
  }
}

/** Parse a query string (or route params) with a schema; 422 on failure. */
export function parseWith<T>(schema: ZodType<T>, value: unknown): T {
  const parsed = schema.safeParse(value);
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

export function queryObject(request: Request): Record<string, string> {
  return Object.fromEntries(new URL(request.url).searchParams.entries());
}

type Refusal = { name: string; code: string; message: string; details?: unknown };
const isEngineRefusal = (e: unknown): e is Refusal => e instanceof Error && e.name === "EngineRefusal" && typeof (e as unknown as Refusal).code === "string";

/** Turn any thrown value into the error shape. Unexpected errors say nothing about internals. */
export function toErrorResponse(error: unknown): Response {
  if (error instanceof AppError) {
    const retry = (error.details as { retryAfterSeconds?: number } | undefined)?.retryAfterSeconds;
    return errorResponse(error.status, error.code, error.message, error.details, retry ? { "Retry-After": String(retry) } : undefined);
  }
  if (isEngineRefusal(error)) return errorResponse(422, error.code, error.message, error.details);
  if (error instanceof ZodError) {
    const e = validationError(error);
    return errorResponse(e.status, e.code, e.message, e.details);
  }
  console.error("[heatpath] unexpected error", error instanceof Error ? error.message : String(error));
  return errorResponse(500, "internal", "Something went wrong on our side; the request was not completed.");
}

const MUTATING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * A browser sends Origin with every cross-site write; a cookie-authenticated
 * write from another origin is refused (server actions have the framework's own check).
 */
export function assertSameOrigin(request: Request): void {
  if (!MUTATING.has(request.method) || !/(?:^|;\s*)heatpath_session=/.test(request.headers.get("cookie") ?? "")) return;
  if (request.headers.get("sec-fetch-site") === "cross-site") throw crossOrigin();
  const origin = request.headers.get("origin");
  if (!origin) return;
  const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host") ?? new URL(request.url).host;
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    throw crossOrigin();
  }
  if (originHost !== host) throw crossOrigin();
}

const crossOrigin = () => new AppError(403, "cross-origin", "Requests from another site are refused.");

/** Wrap a route handler so that every failure leaves in the error shape. */
export function route<C = unknown>(handler: (request: Request, context: C) => Promise<Response>) {
  return async (request: Request, context: C): Promise<Response> => {
    try {
      assertSameOrigin(request);
      const response = await handler(request, context);
      // CSV exports and empty answers too, not only json().
      try {
        if (!response.headers.has("cache-control")) response.headers.set("cache-control", NO_STORE);
      } catch {
        // Response.redirect() headers are immutable; a redirect carries no data to cache.
      }
      return response;
    } catch (error) {
      return toErrorResponse(error);
    }
  };
}

/** What Next passes a handler of a dynamic route: the segment values, as a promise. */
type SegmentContext = { params: Promise<Record<string, string>> };

/**
 * `route()` for a route under an `[id]` segment: the id is parsed first (422 `invalid-request`,
 * "Expected a numeric id.", unless a positive integer) and handed over as a number; `params`
 * holds every segment as sent, for a route with more than one.
 * `export const GET = withId(async (request, id) => json(await service(await getActor(), id)))`.
 */
export function withId(handler: (request: Request, id: number, params: Record<string, string>) => Promise<Response>) {
  return route<SegmentContext>(async (request, { params }) => {
    const segments = await params;
    return handler(request, parseWith(idParamSchema, segments.id), segments);
  });
}
