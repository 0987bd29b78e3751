import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { ALL_WHO, signInAs } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";
import type { Expect, Row } from "./matrix/types";

// Every tests/api/matrix/*.rows.ts file contributes its ROWS; a route without a row fails below.
const files = import.meta.glob<{ ROWS: Row[] }>("./matrix/*.rows.ts", { eager: true });
const ROUTES: Row[] = Object.values(files).flatMap((f) => f.ROWS);

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

describe("every route handler has a row", () => {
  it("lists each exported method of each route.ts under app/api", () => {
    const root = path.resolve("app/api/v1");
    const found: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const p = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(p);
        else if (entry.name === "route.ts") {
          const rel = path.relative(root, dir).split(path.sep).join("/");
          const source = fs.readFileSync(p, "utf8");
          for (const m of source.matchAll(/export (?:const|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)) found.push(`${m[1]} ${rel}`);
        }
      }
    };
    walk(root);
    const covered = new Set(ROUTES.map((r) => `${r.method} ${r.file}`));
    expect(found.filter((f) => !covered.has(f))).toEqual([]);
  });
});

describe.each(ROUTES.filter((r) => r.author))("$method $file ($name) by the author", (row) => {
  it(`as the author (${row.author!.who})`, async () => {
    const author = row.author!;
    const prepared = await author.prepare();
    await signInAs(author.who);
    const response = await row.handler(jsonRequest(row.method, `/api/v1/${row.file}${row.query ? `?${row.query}` : ""}`, prepared.body), ctx(prepared.params ?? {}));
    expect(response.status).toBe(author.expect);
  });
});

describe.each(ROUTES.filter((r) => r.contributors?.length))("$method $file ($name) by a contributor", (row) => {
  it.each(row.contributors!)("as the $as ($who)", async (c) => {
    const prepared = await c.prepare();
    await signInAs(c.who);
    const response = await row.handler(jsonRequest(row.method, `/api/v1/${row.file}`, prepared.body), ctx(prepared.params ?? {}));
    expect(response.status).toBe(c.expect);
    expect(await bodyOf(response)).toMatchObject({ error: { code: "own-work" } });
  });
});

describe.each(ROUTES)("$method $file ($name)", (row) => {
  it.each(ALL_WHO)("as %s", async (who) => {
    const prepared = row.prepare ? await row.prepare() : {};
    await signInAs(who);
    const request = jsonRequest(row.method, `/api/v1/${row.file}${row.query ? `?${row.query}` : ""}`, prepared.body, prepared.headers);
    const response = await row.handler(request, ctx(prepared.params ?? {}));
    expect(response.status).toBe(row.expect[who as keyof Expect]);
    if (response.status >= 400) {
      expect(await bodyOf(response)).toEqual({ error: { code: expect.any(String), message: expect.any(String) } });
    }
  });
});
