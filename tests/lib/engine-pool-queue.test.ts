/**
 * The pool's bounded queue: with one worker busy and the queue full, the next job is refused
 * with 429 engine-busy and a Retry-After, and the queued job still runs. Synthetic requests.
 */
import { afterAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  process.env.ENGINE_THREADS = "1";
  process.env.ENGINE_QUEUE_LIMIT = "1";
});

const { closeEnginePool, runEngine } = await import("@/lib/engine-pool");
const { toErrorResponse } = await import("@/lib/http");
const { heavyRequest, smallRequest } = await import("../helpers/heavy");

afterAll(() => closeEnginePool());

describe("engine pool queue", () => {
  it("refuses a job beyond ENGINE_QUEUE_LIMIT with 429 and Retry-After", async () => {
    await runEngine(smallRequest()); // the one worker is up
    const heavy = runEngine(heavyRequest(), { timeoutMs: 1_500 }).catch((e: unknown) => e);
    // Its budget (1 s) is shorter than its wait behind the heavy job: waiting is not counted.
    const queued = runEngine(smallRequest(), { timeoutMs: 1_000 });
    const refused = await runEngine(smallRequest()).catch((e: unknown) => e);
    expect(refused).toMatchObject({ status: 429, code: "engine-busy" });
    const res = toErrorResponse(refused);
    expect(res.status).toBe(429);
    expect(res.headers.get("retry-after")).toBe("5");
    expect(await res.json()).toMatchObject({ error: { code: "engine-busy", message: expect.stringContaining("busy") } });
    // The queued job runs once the worker is free (the heavy one is stopped and its worker replaced).
    await heavy;
    expect((await queued).points).toHaveLength(20);
  });
});
