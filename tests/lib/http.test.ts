import { describe, expect, it } from "vitest";
import { z } from "zod";
import { readJson, route, toErrorResponse, withId } from "@/lib/http";
import { AppError } from "@/lib/errors";

const schema = z.object({ n: z.number() });

function req(body: BodyInit | null, type = "application/json", extra: Record<string, string> = {}) {
  return new Request("http://127.0.0.1/x", { method: "POST", body, headers: { "content-type": type, ...extra }, duplex: "half" } as RequestInit);
}

async function failure(p: Promise<unknown>) {
  try {
    await p;
  } catch (e) {
    return e as AppError;
  }
  throw new Error("expected a failure");
}

describe("readJson", () => {
  it("parses a valid body", async () => {
    await expect(readJson(req('{"n":1}'), schema)).resolves.toEqual({ n: 1 });
  });

  it.each([
    ["wrong content type", req('{"n":1}', "text/plain"), 415, "unsupported-media-type", "Send the body as application/json."],
    ["malformed JSON", req('{"n":'), 400, "malformed-json", "The body is not valid JSON."],
    ["schema failure", req('{"n":"x"}'), 422, "invalid-request", "n: Invalid input: expected number, received string"],
  ])("refuses %s", async (_label, request, status, code, message) => {
    const e = await failure(readJson(request, schema));
    expect(e).toMatchObject({ status, code, message });
  });

  it("stops reading a streamed body at the limit (no content-length)", async () => {
    let pulled = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        pulled += 1;
        controller.enqueue(new Uint8Array(1024).fill(32));
        if (pulled > 10_000) controller.close();
      },
    });
    const e = await failure(readJson(req(stream), schema, 4096));
    expect(e).toMatchObject({ status: 413, code: "body-too-large" });
    expect(pulled).toBeLessThan(20);
  });

  it("refuses a declared length over the limit before reading", async () => {
    const e = await failure(readJson(req("{}", "application/json", { "content-length": "999999" }), schema, 100));
    expect(e).toMatchObject({ status: 413 });
  });
});

describe("error shape", () => {
  it("hides unexpected errors behind a 500 with no internals", async () => {
    const handler = route(async () => {
      throw new Error("SQLITE_ERROR: no such table secret_stuff at /work/main/lib/x.ts:3");
    });
    const response = await handler(new Request("http://127.0.0.1/"), {});
    expect(response.status).toBe(500);
    const text = await response.text();
    expect(text).not.toMatch(/SQLITE|secret_stuff|\.ts/);
    expect(JSON.parse(text)).toEqual({ error: { code: "internal", message: expect.any(String) } });
  });

  it("keeps an AppError's status, code and details", async () => {
    const r = toErrorResponse(new AppError(409, "conflict", "Stale.", { current: 3 }));
    expect(r.status).toBe(409);
    expect(await r.json()).toEqual({ error: { code: "conflict", message: "Stale.", details: { current: 3 } } });
  });
});

describe("origin check on cookie-authenticated writes", () => {
  const handler = route(async () => new Response(null, { status: 204 }));
  const call = (headers: Record<string, string>, method = "POST") => handler(new Request("http://127.0.0.1:3000/api/v1/x", { method, headers }), {});

  it.each([
    ["another origin", { cookie: "heatpath_session=abc", origin: "http://evil.example.test", host: "127.0.0.1:3000" }, 403],
    ["a cross-site fetch", { cookie: "heatpath_session=abc", "sec-fetch-site": "cross-site", host: "127.0.0.1:3000" }, 403],
    ["a garbled origin", { cookie: "heatpath_session=abc", origin: "::::", host: "127.0.0.1:3000" }, 403],
    ["the same origin", { cookie: "heatpath_session=abc", origin: "http://127.0.0.1:3000", host: "127.0.0.1:3000" }, 204],
    ["no cookie (nothing to forge)", { origin: "http://evil.example.test", host: "127.0.0.1:3000" }, 204],
    ["a script without Origin", { cookie: "heatpath_session=abc", host: "127.0.0.1:3000" }, 204],
  ])("%s → %s", async (_label, headers, status) => {
    const r = await call(headers as Record<string, string>);
    expect(r.status).toBe(status);
    if (status === 403) expect(await r.json()).toEqual({ error: { code: "cross-origin", message: "Requests from another site are refused." } });
  });

  it("leaves reads alone", async () => {
    expect((await call({ cookie: "heatpath_session=abc", origin: "http://evil.example.test" }, "GET")).status).toBe(204);
  });
});

describe("withId", () => {
  const handler = withId(async (_request, id, params) => Response.json({ id, params }));
  const call = (params: Record<string, string>) => handler(new Request("http://127.0.0.1/api/v1/x/1"), { params: Promise.resolve(params) });

  it("hands the handler the id as a number and every segment as sent", async () => {
    const r = await call({ id: "12", revision: "3" });
    expect(await r.json()).toEqual({ id: 12, params: { id: "12", revision: "3" } });
  });

  it.each(["0", "-1", "1.5", "abc", ""])("refuses the id %j with 422 before the handler runs", async (id) => {
    const r = await call({ id });
    expect(r.status).toBe(422);
    expect(await r.json()).toEqual({ error: { code: "invalid-request", message: "Expected a numeric id.", details: { fields: { _: "Expected a numeric id." } } } });
  });
});
