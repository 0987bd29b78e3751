/**
 * The per-process cache of frozen snapshots (lib/services/results-cache.ts) and its LRU
 * (lib/lru.ts): a hit answers the same content without reading it from the database again, a
 * miss reads it, an entry answers only its own team, case, snapshot and hash, and the cache
 * stays within its bounds. Cases use the reference library of tests/helpers (the water-gas
 * shift over a small grid); the weights in the LRU checks are synthetic, invented for this test.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import * as resultsRoute from "@/app/api/v1/cases/[id]/results/route";
import { closeDb, models } from "@/lib/db";
import { BoundedLru } from "@/lib/lru";
import { createCase, getResults, submitCase, updateCase } from "@/lib/services/cases";
import { decideCase } from "@/lib/services/reviews";
import { cacheKey, frozenResultsCache, frozenSnapshot, MAX_VIEWS_PER_SNAPSHOT, resultJson, resultsJson } from "@/lib/services/results-cache";
import { inFormat } from "@/lib/thermo/columns";
import { caseInputSchema, decisionSchema } from "@/lib/validation/cases";
import { actorOf, signInAs } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";

let pins: Record<RefFormula, number>;

beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
});
beforeEach(() => frozenResultsCache().clear());
afterAll(() => closeDb());

type W = { weight: number; name: string };
const w = (name: string, weight = 1): W => ({ name, weight });

describe("BoundedLru", () => {
  it("answers a hit, misses an unknown key, and evicts the least recently used first", () => {
    const lru = new BoundedLru<W>(2);
    lru.set("a", w("a"));
    lru.set("b", w("b"));
    expect(lru.get("a")?.name).toBe("a");
    expect(lru.get("zz")).toBeUndefined();
    lru.set("c", w("c")); // "b" is now the oldest
    expect(lru.peek("b")).toBeUndefined();
    expect([lru.peek("a")?.name, lru.peek("c")?.name]).toEqual(["a", "c"]);
    expect(lru.size).toBe(2);
  });

  it("keeps the total weight within its budget, drops an entry heavier than the budget, and re-weighs a grown entry", () => {
    const lru = new BoundedLru<W>(100, 10);
    lru.set("a", w("a", 4));
    lru.set("b", w("b", 4));
    lru.set("c", w("c", 4)); // 12 > 10: "a" goes
    expect([lru.peek("a"), lru.size, lru.weight]).toEqual([undefined, 2, 8]);
    lru.set("huge", w("huge", 11));
    expect(lru.peek("huge")).toBeUndefined();
    expect(lru.weight).toBe(8);
    lru.grew("c", 4); // c is 8 now: b goes, c stays
    expect([lru.peek("b"), lru.peek("c")?.weight, lru.weight]).toEqual([undefined, 8, 8]);
    lru.set("c", w("c", 1)); // replacing counts the new weight only
    expect(lru.weight).toBe(1);
  });
});

async function submittedCase(title: string) {
  const erin = await actorOf("engineer");
  const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title })));
  await submitCase(erin, c.id, c.lockVersion);
  return c;
}

describe("frozen snapshots", () => {
  it("a miss reads the snapshot once; a hit answers the same content from memory, deep-frozen", async () => {
    const erin = await actorOf("engineer");
    const c = await submittedCase("Cache: hit and miss");
    const read = vi.spyOn(models().CaseSnapshot, "findByPk");
    const first = await getResults(erin, c.id);
    expect(read).toHaveBeenCalledTimes(1);
    const second = await getResults(erin, c.id);
    expect(read).toHaveBeenCalledTimes(1);
    read.mockRestore();
    expect(second).toEqual(first);
    expect(second.result).toBe(first.result);
    const stored = (await models().CaseSnapshot.findOne({ where: { caseId: c.id } }))!;
    expect(second.result).toEqual(stored.result);
    expect(second.hash).toBe(stored.hash);
    expect(() => {
      (second.result.points[0] as { dGkJ: number }).dGkJ = 0;
    }).toThrow(TypeError);
    expect(second.result.points[0].dGkJ).toBe(stored.result.points[0].dGkJ);
  });

  it("never answers another team: 404 before the cache is asked, and the key carries team, case, snapshot and hash", async () => {
    const erin = await actorOf("engineer");
    const other = await actorOf("other");
    const c = await submittedCase("Cache: another team");
    await getResults(erin, c.id); // now cached
    await expect(getResults(other, c.id)).rejects.toMatchObject({ status: 404 });
    await expect(getResults(other, c.id, 1)).rejects.toMatchObject({ status: 404 });
    // Asked directly with the wrong team, the loader refuses too (a second lock behind the case's own check).
    await expect(frozenSnapshot(other.teamId, c.id)).rejects.toMatchObject({ status: 404 });
    const snap = (await models().CaseSnapshot.findOne({ where: { caseId: c.id } }))!;
    expect(frozenResultsCache().peek(cacheKey(erin.teamId, c.id, snap.id, snap.hash))).toBeDefined();
    expect(frozenResultsCache().peek(cacheKey(other.teamId, c.id, snap.id, snap.hash))).toBeUndefined();
    // Through the route, with the other team's cookie: 404, and no answer text of the cached entry.
    await signInAs("other");
    const r = await resultsRoute.GET(jsonRequest("GET", `/api/v1/cases/${c.id}/results?format=columns`), ctx({ id: String(c.id) }) as never);
    expect(r.status).toBe(404);
    expect(JSON.stringify(await bodyOf(r))).not.toContain("dGkJ");
  });

  it("keeps each revision apart, and a draft is never cached", async () => {
    const erin = await actorOf("engineer");
    const rory = await actorOf("reviewer");
    const c = await submittedCase("Cache: revisions");
    const r1 = await getResults(erin, c.id);
    const returned = await decideCase(rory, c.id, decisionSchema.parse({ decision: "returned", reason: "Extend the span to 800 K." }));
    const before = frozenResultsCache().size;
    const edited = await updateCase(erin, c.id, {
      ...caseInputSchema.parse(shiftCase(pins, { title: "Cache: revisions", temperatures: { fromK: 480, toK: 800, stepK: 20 } })),
      lockVersion: returned.lockVersion,
    });
    const live = await getResults(erin, c.id);
    expect(live.source).toBe("live");
    expect(frozenResultsCache().size).toBe(before);
    await submitCase(erin, c.id, edited.lockVersion);
    const r2 = await getResults(erin, c.id);
    expect([r1.revision, r2.revision]).toEqual([1, 2]);
    expect(r2.hash).not.toBe(r1.hash);
    expect(r2.result.points.length).not.toBe(r1.result.points.length);
    expect((await getResults(erin, c.id, 1)).result).toBe(r1.result);
    expect((await getResults(erin, c.id, 2)).result).toBe(r2.result);
    await expect(getResults(erin, c.id, 3)).rejects.toMatchObject({ status: 404 });
  });

  it("serialises a frozen result once per view, a live one every time, and gives JSON.stringify's text", async () => {
    const erin = await actorOf("engineer");
    const c = await submittedCase("Cache: views");
    const frozen = await getResults(erin, c.id);
    const render = vi.fn(() => inFormat(frozen.result, "columns"));
    const a = resultsJson(frozen, "columns", render);
    const b = resultsJson(frozen, "columns", render);
    expect(render).toHaveBeenCalledTimes(1);
    expect(a).toBe(b);
    expect(a).toBe(JSON.stringify({ ...frozen, result: inFormat(frozen.result, "columns") }));
    expect(resultsJson(frozen, "rows", () => frozen.result)).toBe(JSON.stringify(frozen));

    const draft = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Cache: live views" })));
    const live = await getResults(erin, draft.id);
    const liveRender = vi.fn(() => live.result);
    resultJson(live.result, "rows", liveRender);
    resultJson(live.result, "rows", liveRender);
    expect(liveRender).toHaveBeenCalledTimes(2);

    // At most MAX_VIEWS_PER_SNAPSHOT views are kept per snapshot; the oldest goes first.
    for (let i = 0; i <= MAX_VIEWS_PER_SNAPSHOT; i++) resultJson(frozen.result, `page:${i}`, () => i);
    const again = vi.fn(() => 0);
    resultJson(frozen.result, "page:0", again);
    expect(again).toHaveBeenCalledTimes(1);
  });

  it("stays within its bounds: the least recently read snapshot leaves first and is read again when asked", async () => {
    const erin = await actorOf("engineer");
    const cache = frozenResultsCache();
    const cases = [await submittedCase("Cache: bound 1"), await submittedCase("Cache: bound 2"), await submittedCase("Cache: bound 3")];
    for (const c of cases) await getResults(erin, c.id);
    expect(cache.size).toBe(3);
    expect(cache.weight).toBeGreaterThan(0);
    // A cache of two: reading a third evicts the least recently used.
    const small = new BoundedLru<{ weight: number }>(2);
    (globalThis as { __heatpathFrozenResults?: unknown }).__heatpathFrozenResults = small;
    try {
      for (const c of cases) await getResults(erin, c.id);
      expect(small.size).toBe(2);
      const read = vi.spyOn(models().CaseSnapshot, "findByPk");
      await getResults(erin, cases[0].id); // evicted: read again
      expect(read).toHaveBeenCalledTimes(1);
      await getResults(erin, cases[0].id); // now a hit
      expect(read).toHaveBeenCalledTimes(1);
      read.mockRestore();
    } finally {
      (globalThis as { __heatpathFrozenResults?: unknown }).__heatpathFrozenResults = cache;
    }
  });
});
