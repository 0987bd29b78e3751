/**
 * The server's engine pool (lib/engine-pool.ts): the same answers and refusals as
 * `evaluate()`, a wall-time budget that stops and replaces the worker, and a bounded queue.
 * Requests are synthetic, invented for this test (tests/helpers/heavy.ts).
 */
import { afterAll, describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { closeEnginePool, enginePool, runEngine, runEngineTask } from "@/lib/engine-pool";
import { evaluate, EngineRefusal } from "@/lib/thermo";
import { heavyRequest, smallRequest } from "../helpers/heavy";

// ENGINE_THREADS and ENGINE_QUEUE_LIMIT keep their defaults here (2 and 32); the queue test sets its own pool below.
afterAll(() => closeEnginePool());

const heavy = () => heavyRequest();

async function refusalOf(p: Promise<unknown>): Promise<unknown> {
  try {
    await p;
  } catch (error) {
    return error;
  }
  throw new Error("expected a refusal");
}

describe("engine pool", () => {
  it("answers exactly what evaluate() answers", async () => {
    const request = smallRequest();
    expect(await runEngine(request)).toEqual(JSON.parse(JSON.stringify(evaluate(request))));
  });

  it("passes the engine's refusal through unchanged (an EngineRefusal with its code, message and details)", async () => {
    const bad = { ...smallRequest(), reaction: "H2(g) + Cl2(g) = HCl(g)" };
    let direct: EngineRefusal | undefined;
    try {
      evaluate(bad);
    } catch (e) {
      direct = e as EngineRefusal;
    }
    const pooled = await refusalOf(runEngine(bad));
    expect(pooled).toBeInstanceOf(EngineRefusal);
    expect((pooled as EngineRefusal).toJSON()).toEqual(direct!.toJSON());
  });

  it("runs other named jobs (compareSources)", async () => {
    const request = smallRequest();
    const variants = [
      { label: "first", species: {} },
      { label: "second", species: { "HCl(g)": { ...request.species["HCl(g)"], reference: { tK: 298.15, phase: "g", hkJ: -92.0, sJ: 200 } } } },
    ];
    const out = await runEngineTask("compareSources", { request: request as never, variants: variants as never });
    expect(out.variants.map((v: { label: string }) => v.label)).toEqual(["first", "second"]);
  });

  it("stops a job over its time budget with 503 engine-time-limit, replaces the worker, and the next job works", async () => {
    const before = enginePool().threads.map((t) => t.threadId);
    const error = await refusalOf(runEngine(heavy(), { timeoutMs: 300 }));
    expect(error).toBeInstanceOf(AppError);
    expect(error).toMatchObject({ status: 503, code: "engine-time-limit", message: expect.stringContaining("did not finish within 0.3 s") });
    const after = await runEngine(smallRequest());
    expect(after.points).toHaveLength(20);
    // The worker that ran the heavy job is gone.
    const now = enginePool().threads.map((t) => t.threadId);
    expect(before.some((id) => !now.includes(id))).toBe(true);
  });
});

describe("engine pool, odd payloads", () => {
  it("refuses a 20 000-deep array exactly as evaluate() does (it cannot be sent to a worker)", async () => {
    const deep = JSON.parse("[".repeat(20_000) + "]".repeat(20_000));
    let direct: EngineRefusal | undefined;
    try {
      evaluate(deep);
    } catch (e) {
      direct = e as EngineRefusal;
    }
    const pooled = await refusalOf(runEngine(deep));
    expect(pooled).toBeInstanceOf(EngineRefusal);
    expect((pooled as EngineRefusal).toJSON()).toEqual(direct!.toJSON());
    const nested = { ...smallRequest(), species: { "H2(g)": JSON.parse('{"a":'.repeat(3000) + "1" + "}".repeat(3000)) } };
    await expect(runEngine(nested)).rejects.toBeInstanceOf(EngineRefusal);
  });
});
