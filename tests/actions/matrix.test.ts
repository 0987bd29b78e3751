import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { ALL_WHO, signInAs } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import type { ActionExpect, ActionRow, Outcome } from "./types";

// Every tests/actions/*.actions.ts file contributes its ACTIONS; an exported server action without a row fails below.
const files = import.meta.glob<{ ACTIONS: ActionRow[] }>("./*.actions.ts", { eager: true });
const ACTIONS: ActionRow[] = Object.values(files).flatMap((f) => f.ACTIONS);

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

function isRedirect(error: unknown): boolean {
  return typeof error === "object" && error !== null && String((error as { digest?: string }).digest ?? "").startsWith("NEXT_REDIRECT");
}

async function outcomeOf(row: ActionRow, fields: Record<string, string>): Promise<Outcome> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  try {
    const state = (await row.action({ ok: false } as never, form)) as { ok: boolean; status?: number } | undefined;
    if (!state || state.ok) return "ok";
    return state.status ?? 0;
  } catch (error) {
    if (isRedirect(error)) return "ok";
    throw error;
  }
}

describe("every server action has a row", () => {
  it("lists each exported async function of each actions.ts under app/", () => {
    const found: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const p = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(p);
        else if (entry.name === "actions.ts") {
          for (const m of fs.readFileSync(p, "utf8").matchAll(/export async function (\w+)/g)) found.push(`${path.relative(process.cwd(), p).split(path.sep).join("/")}#${m[1]}`);
        }
      }
    };
    walk(path.resolve("app"));
    const covered = new Set(ACTIONS.map((a) => a.id));
    expect(found.filter((f) => !covered.has(f))).toEqual([]);
  });
});

describe.each(ACTIONS)("$id", (row) => {
  it.each(ALL_WHO)("as %s", async (who) => {
    const fields = row.prepare ? await row.prepare() : {};
    await signInAs(who);
    expect(await outcomeOf(row, fields)).toBe(row.expect[who as keyof ActionExpect]);
  });
});
