import "server-only";
import { models } from "@/lib/db";
import { notFound } from "@/lib/errors";
import { BoundedLru } from "@/lib/lru";
import type { CaseSnapshot } from "@/models/case-snapshot";

/**
 * Frozen snapshots, read and parsed once per process.
 *
 * A submitted case answers with its stored snapshot, which never changes (no service path
 * updates one, and database triggers refuse). Reading it means pulling megabytes of JSON
 * out of the database and parsing them, then serialising them again for the answer, on
 * every view of a large case. Here a snapshot's content is kept parsed, keyed by team,
 * snapshot id and content hash, in a bounded least-recently-used cache, and the JSON text of
 * each shape of its result the route answers (rows, columns, a drawing sample, a table page)
 * is kept beside it.
 *
 * What it does not change: every request still signs in, loads its case and passes the
 * service's permission and team checks first (404 for another team's case); only then is the
 * cache asked, and its key carries the team, so an entry is never handed to another team.
 * Drafts are evaluated live on every request (the engine pool) and never cached. Entries are
 * deep-frozen: a caller that tried to change a shared result would fail loudly instead of
 * changing the next reader's answer.
 */

/** The snapshot fields `getResults` answers with. */
export type FrozenSnapshot = Pick<CaseSnapshot, "revision" | "hash" | "createdAt" | "inputs" | "pins" | "request" | "result">;

type Entry = {
  content: Omit<FrozenSnapshot, "revision" | "createdAt">;
  /** JSON text of the result per view (`resultJson`), most recently used last. */
  views: Map<string, string>;
  /** Estimated bytes held: the parsed content plus the view texts. */
  weight: number;
};

/** At most this many snapshots per process… */
export const MAX_CACHED_SNAPSHOTS = 64;
/** …and about this many bytes of parsed results and answer texts (a 10 000-point case is about 5 MB with its views). */
export const MAX_CACHED_BYTES = 96 * 1024 * 1024;
/** Views (answer shapes) kept per snapshot: rows, columns, the page's drawing sample and its recent table pages. */
export const MAX_VIEWS_PER_SNAPSHOT = 12;
/** Rough heap bytes of one parsed per-temperature point with its share of the other per-temperature arrays. */
const BYTES_PER_POINT = 600;

type Holder = { __heatpathFrozenResults?: BoundedLru<Entry>; __heatpathFrozenEntries?: WeakMap<object, { key: string; entry: Entry }> };
const holder = globalThis as Holder;

/** One cache per process, kept on globalThis because Next bundles each route separately. */
export function frozenResultsCache(): BoundedLru<Entry> {
  holder.__heatpathFrozenResults ??= new BoundedLru<Entry>(MAX_CACHED_SNAPSHOTS, MAX_CACHED_BYTES);
  return holder.__heatpathFrozenResults;
}

/** The entry a cached result object belongs to (identity), for its view texts. */
function entriesByResult(): WeakMap<object, { key: string; entry: Entry }> {
  holder.__heatpathFrozenEntries ??= new WeakMap();
  return holder.__heatpathFrozenEntries;
}

/** Team, case, snapshot id and content hash: an entry answers only for the snapshot it was read from, and only to its team. */
export const cacheKey = (teamId: number, caseId: number, snapshotId: number, hash: string) => `${teamId}:${caseId}:${snapshotId}:${hash}`;

function deepFreeze<T>(value: T): T {
  const stack: unknown[] = [value];
  while (stack.length) {
    const v = stack.pop();
    if (v === null || typeof v !== "object" || Object.isFrozen(v)) continue;
    Object.freeze(v);
    for (const child of Object.values(v)) if (child !== null && typeof child === "object") stack.push(child);
  }
  return value;
}

/**
 * The latest snapshot of a case (or revision `revision`), for a caller that has already
 * loaded the case as a member of `teamId`. `null` when the case has no snapshot and no
 * revision was asked for; 404 `Snapshot` when the asked revision does not exist. Only the
 * snapshot's id and hash are read from the database when its content is cached.
 */
export async function frozenSnapshot(teamId: number, caseId: number, revision?: number): Promise<FrozenSnapshot | null> {
  const { CaseSnapshot } = models();
  const meta = await CaseSnapshot.findOne({
    where: revision === undefined ? { caseId } : { caseId, revision },
    order: [["revision", "DESC"]],
    attributes: ["id", "teamId", "caseId", "revision", "hash", "createdAt"],
  });
  if (!meta) {
    if (revision !== undefined) throw notFound("Snapshot");
    return null;
  }
  // A snapshot belongs to its case's team; the team check on the case has run, this is a second lock.
  if (meta.teamId !== teamId) throw notFound("Snapshot");
  const key = cacheKey(teamId, caseId, meta.id, meta.hash);
  const cache = frozenResultsCache();
  let entry = cache.get(key);
  if (!entry) {
    const row = await CaseSnapshot.findByPk(meta.id);
    if (!row) throw notFound("Snapshot");
    const content = deepFreeze({ hash: row.hash, inputs: row.inputs, pins: row.pins, request: row.request, result: row.result });
    entry = { content, views: new Map(), weight: BYTES_PER_POINT * (row.result.points?.length ?? 0) + 64 * 1024 };
    cache.set(key, entry);
    entriesByResult().set(content.result, { key, entry });
  }
  return { ...entry.content, revision: meta.revision, createdAt: meta.createdAt };
}

/**
 * The JSON text of `result` in one view (`view` names it: format and query), made by
 * `render` (which returns the value to serialise). A frozen snapshot's result keeps its texts, so
 * the same view is serialised once per process; any other result (a live draft) is serialised
 * each time.
 */
export function resultJson(result: object, view: string, render: () => unknown): string {
  const found = entriesByResult().get(result);
  if (!found) return JSON.stringify(render());
  const { key, entry } = found;
  // An entry evicted while a request still held its result keeps no more views.
  if (frozenResultsCache().peek(key) !== entry) return JSON.stringify(render());
  const cached = entry.views.get(view);
  if (cached !== undefined) {
    entry.views.delete(view);
    entry.views.set(view, cached);
    return cached;
  }
  const text = JSON.stringify(render());
  entry.views.set(view, text);
  let delta = text.length;
  for (const [oldest, old] of entry.views) {
    if (entry.views.size <= MAX_VIEWS_PER_SNAPSHOT) break;
    entry.views.delete(oldest);
    delta -= old.length;
  }
  frozenResultsCache().grew(key, delta);
  return text;
}

/**
 * The JSON text of a results answer (`getResults`), its `result` in view `view` made by
 * `render`: what `JSON.stringify({ ...results, result: render() })` gives, with the result's
 * text from `resultJson` (made once per view for a frozen snapshot). `result` is the answer's
 * last key, as in `ResultsDto`.
 */
export function resultsJson(results: { result: object }, view: string, render: () => unknown): string {
  const { result, ...rest } = results;
  const text = resultJson(result, view, render);
  const head = JSON.stringify(rest);
  return head === "{}" ? `{"result":${text}}` : `${head.slice(0, -1)},"result":${text}}`;
}
