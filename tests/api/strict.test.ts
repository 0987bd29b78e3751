/**
 * Every request object is strict: an unknown or misspelt field is refused with 422, naming the
 * field (and the known field it was probably meant to be), and nothing is written.
 *
 * Walks the route matrix (tests/api/matrix/*.rows.ts): every write row that sends a body gets
 * that valid body plus a misspelt copy of one of its fields; every GET route that reads a query
 * string gets a misspelt query parameter. Rows that cannot be walked are listed below by name,
 * and a guard fails when a new row fits neither. The server-action matrix (tests/actions) is
 * walked the same way, with the framework's own `$ACTION_*` form keys still accepted.
 */
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { signInAs, type Who } from "../helpers/actors";
import { databaseChecksum } from "../helpers/checksum";
import { freshDatabase } from "../helpers/db";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";
import type { Expect, Row } from "./matrix/types";
import { evaluateRequestSchema } from "@/lib/thermo/schema";
import type { ActionExpect, ActionRow } from "../actions/types";

const rowFiles = import.meta.glob<{ ROWS: Row[] }>("./matrix/*.rows.ts", { eager: true });
const ROUTES: Row[] = Object.values(rowFiles).flatMap((f) => f.ROWS);
const actionFiles = import.meta.glob<{ ACTIONS: ActionRow[] }>("../actions/*.actions.ts", { eager: true });
const ACTIONS: ActionRow[] = Object.values(actionFiles).flatMap((f) => f.ACTIONS);

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

/** A slip of the keyboard: two letters swapped ("name" → "nmae"), or a letter added. */
function misspell(key: string): string {
  if (key.length >= 4 && key[1] !== key[2]) return key[0] + key[2] + key[1] + key.slice(3);
  return `${key}s`;
}

/** Write rows that send no body: their handlers read none (the id is in the path). */
const NO_BODY = new Set(["propose", "version impact run", "withdraw", "copy reference", "version delete", "member remove", "revoke invitation", "sign out"]);
/** Rows whose valid body has no body in the matrix but whose handler reads an optional one: given here. */
const OPTIONAL_BODY: Record<string, { body: Record<string, unknown>; field: string }> = { approve: { body: { note: "Checked against the data sheet." }, field: "note" } };
/** Rows whose body is an evaluate request, checked by the engine's own (strict) schema (lib/thermo/schema.ts). */
const ENGINE_FILES = new Set(["evaluate", "equilibrium/sources"]);
const engineBody = (row: Row) => ENGINE_FILES.has(row.file);
/**
 * The engine's request schema is made strict on its own branch; until that lands these two rows
 * are skipped (not passed): the probe turns them on by itself once the engine refuses unknown fields.
 */
const probe = evaluateRequestSchema.safeParse({ reaction: "H2(g) -> H2(g)", species: {}, temperatures: { listK: [300] }, zzUnknown: 1 });
const ENGINE_STRICT = !probe.success && probe.error.issues.some((i) => i.code === "unrecognized_keys");

/** Routes that read a query string (GET unless said), with a misspelt parameter and the name it should suggest. */
const QUERY_TYPOS: Record<string, { query: string; typo: string; meant: string; method?: Row["method"] }> = {
  cases: { query: "statsu=draft", typo: "statsu", meant: "status" },
  "cases/[id]/export": { query: "revison=1", typo: "revison", meant: "revision" },
  "cases/[id]/results": { query: "revison=1", typo: "revison", meant: "revision" },
  "cases/[id]/diff": { query: "form=1", typo: "form", meant: "from" },
  pins: { query: "fromula=H2", typo: "fromula", meant: "formula" },
  models: { query: "pgae=2", typo: "pgae", meant: "page" },
  species: { query: "pgaeSize=5", typo: "pgaeSize", meant: "pageSize" },
  "versions/[id]/curve": { query: "fromk=300", typo: "fromk", meant: "fromK" },
  "library/export": { query: "model=1", typo: "model", meant: "models" },
  audit: { query: "entityTpye=case", typo: "entityTpye", meant: "entityType" },
  health: { query: "depe=1", typo: "depe", meant: "deep" },
  evaluate: { query: "fromat=columns", typo: "fromat", meant: "format", method: "POST" },
};

const routeSource = (file: string) => fs.readFileSync(path.resolve("app/api/v1", file, "route.ts"), "utf8");

const CALLERS: Exclude<Who, "steward2">[] = ["steward", "admin", "engineer", "reviewer", "other", "anonymous"];
/** Someone the row lets through, so the refusal is about the body and not the caller. */
const callerOf = (expect: Expect | ActionExpect): Exclude<Who, "steward2"> =>
  CALLERS.find((w) => {
    const e = expect[w as keyof typeof expect];
    return e === "ok" || (typeof e === "number" && e < 300);
  }) ?? "anonymous";

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

async function refusedUnchanged(
  row: Row,
  prepared: { params?: Record<string, string>; headers?: Record<string, string> },
  body: unknown,
  typo: string,
  meant: string | null,
  query = "",
) {
  await signInAs(callerOf(row.expect));
  const before = await databaseChecksum();
  const search = [row.query, query].filter(Boolean).join("&");
  const response = await row.handler(jsonRequest(row.method, `/api/v1/${row.file}${search ? `?${search}` : ""}`, body, prepared.headers), ctx(prepared.params ?? {}));
  const out = (await bodyOf(response)) as { error?: { code: string; message: string; details?: { fields?: Record<string, string> } } };
  expect(response.status, JSON.stringify(out)).toBe(422);
  expect(out.error!.message).toContain(`"${typo}"`);
  if (meant) expect(out.error!.message).toContain(`did you mean "${meant}"`);
  expect(await databaseChecksum()).toBe(before);
  return out;
}

const writeRows = ROUTES.filter((r) => r.method !== "GET");

describe("every write row is walked or listed", () => {
  it("each write row sends an object body, or is listed as bodiless, optional-body or engine-checked", async () => {
    const unclassified: string[] = [];
    for (const row of writeRows) {
      if (NO_BODY.has(row.name) || OPTIONAL_BODY[row.name]) continue;
      const prepared = row.prepare ? await row.prepare() : {};
      if (!isPlainObject(prepared.body)) unclassified.push(row.name);
    }
    expect(unclassified).toEqual([]);
  });

  it("every route that reads a query string has a misspelt parameter below", () => {
    const reading = [...new Set(ROUTES.filter((r) => /queryObject\(/.test(routeSource(r.file))).map((r) => r.file))].sort();
    expect(reading).toEqual(Object.keys(QUERY_TYPOS).sort());
  });
});

describe.each(writeRows.filter((r) => !NO_BODY.has(r.name)))("$method $file ($name) with a misspelt extra field", (row) => {
  it.skipIf(engineBody(row) && !ENGINE_STRICT)("is refused with 422 naming the field, and writes nothing", async () => {
    const prepared = row.prepare ? await row.prepare() : {};
    const optional = OPTIONAL_BODY[row.name];
    const body = optional ? optional.body : (prepared.body as Record<string, unknown>);
    const field = optional ? optional.field : Object.keys(body)[0];
    const typo = misspell(field);
    expect(body).not.toHaveProperty(typo);
    const out = await refusedUnchanged(row, prepared, { ...body, [typo]: body[field] }, typo, field);
    // The ordinary validation shape also keys the refusal by the unknown field.
    if (out.error!.code === "invalid-request" && !engineBody(row)) expect(out.error!.details!.fields![typo]).toContain(`"${typo}"`);
  });
});

/** Misspelt fields inside nested objects of a few bodies (the walk above covers the top level). */
const NESTED: { row: string; edit: (body: Record<string, unknown>) => Record<string, unknown>; typo: string; meant: string | null }[] = [
  // Each species entry is replaced by every family's data, so a field in it would be ignored: refused.
  { row: "equilibrium sources", edit: (b) => ({ ...b, species: { ...(b.species as object), "H2(g)": { segments: [] } } }), typo: "segments", meant: null },
  { row: "model create", edit: (b) => ({ ...b, version: { ...(b.version as object), citatoin: "x" } }), typo: "citatoin", meant: "citation" },
  { row: "case create", edit: (b) => ({ ...b, terms: (b.terms as object[]).map((t, i) => (i === 0 ? { ...t, versoinId: 1 } : t)) }), typo: "versoinId", meant: "versionId" },
  { row: "case create", edit: (b) => ({ ...b, temperatures: { ...(b.temperatures as object), setpK: 10 } }), typo: "setpK", meant: "stepK" },
  { row: "equilibrium save", edit: (b) => ({ ...b, equilibrium: { ...(b.equilibrium as object), feedUnits: "mol" } }), typo: "feedUnits", meant: "feedUnit" },
  { row: "save fit as draft", edit: (b) => ({ ...b, fit: { ...(b.fit as object), tmin: 300 } }), typo: "tmin", meant: "tminK" },
  { row: "fit", edit: (b) => ({ ...b, reference: { ...(b.reference as object), hKj: 1 } }), typo: "hKj", meant: "hkJ" },
  { row: "species critical constants", edit: (b) => ({ critical: { ...(b.critical as object), omgea: 0.1 } }), typo: "omgea", meant: "omega" },
  {
    row: "import",
    edit: (b) => ({ ...b, models: (b.models as { versions: object[] }[]).map((m) => ({ ...m, versions: m.versions.map((v) => ({ ...v, chngeNote: "x" })) })) }),
    typo: "chngeNote",
    meant: "changeNote",
  },
];

describe.each(NESTED)("$row with a nested misspelt field ($typo)", (c) => {
  it("is refused with 422 naming the field, and writes nothing", async () => {
    const row = ROUTES.find((r) => r.name === c.row && r.method !== "GET")!;
    const prepared = row.prepare ? await row.prepare() : {};
    await refusedUnchanged(row, prepared, c.edit(prepared.body as Record<string, unknown>), c.typo, c.meant);
  });
});

describe.each(ROUTES.filter((r) => QUERY_TYPOS[r.file] && r.method === (QUERY_TYPOS[r.file].method ?? "GET")))("$method $file ($name) with a misspelt query parameter", (row) => {
  it("is refused with 422 naming the parameter", async () => {
    const prepared = row.prepare ? await row.prepare() : {};
    const t = QUERY_TYPOS[row.file];
    const out = await refusedUnchanged(row, prepared, prepared.body, t.typo, t.meant, t.query);
    expect(out.error!.details!.fields).toHaveProperty(t.typo);
  });
});

// ------------------------------------------------------------------ server actions

function isRedirect(error: unknown): boolean {
  return typeof error === "object" && error !== null && String((error as { digest?: string }).digest ?? "").startsWith("NEXT_REDIRECT");
}

type State = { ok: boolean; status?: number; message?: string; fieldErrors?: Record<string, string> } | undefined;
async function runAction(row: ActionRow, fields: Record<string, string>): Promise<State | "redirect"> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  try {
    return (await row.action({ ok: false } as never, form)) as State;
  } catch (error) {
    if (isRedirect(error)) return "redirect";
    throw error;
  }
}

/** Actions whose form has no fields of its own. */
const NO_FIELDS = new Set(["app/(app)/actions.ts#signOutAction"]);

describe("every server action with a form is walked or listed", () => {
  it("each action row prepares form fields, or is listed as field-less", () => {
    expect(ACTIONS.filter((a) => !a.prepare && !NO_FIELDS.has(a.id)).map((a) => a.id)).toEqual([]);
  });
});

describe.each(ACTIONS.filter((a) => a.prepare))("$id with a misspelt extra form field", (row) => {
  it("is refused with 422 naming the field, and writes nothing", async () => {
    const fields = await row.prepare!();
    const field = Object.keys(fields)[0];
    const typo = misspell(field);
    await signInAs(callerOf(row.expect));
    const before = await databaseChecksum();
    const state = await runAction(row, { ...fields, [typo]: fields[field] });
    expect(state).not.toBe("redirect");
    const s = state as NonNullable<State>;
    expect([s.ok, s.status]).toEqual([false, 422]);
    expect(s.message).toContain(`"${typo}"`);
    expect(s.fieldErrors?.[typo]).toContain(`did you mean "${field}"`);
    expect(await databaseChecksum()).toBe(before);
  });

  it("accepts the framework's own $ACTION_* keys beside the valid fields", async () => {
    const fields = await row.prepare!();
    const who = callerOf(row.expect);
    await signInAs(who);
    const state = await runAction(row, { ...fields, $ACTION_REF_1: "", "$ACTION_1:0": '{"id":"abc","bound":"$@1"}', $ACTION_KEY: "k1" });
    const expected = row.expect[who as keyof ActionExpect];
    if (expected === "ok") expect(state === "redirect" || state?.ok).toBeTruthy();
    else expect((state as NonNullable<State>).status).toBe(expected);
  });
});
