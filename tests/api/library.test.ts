/** The library API doors: the error shape of a stale edit, a refused upload and the export download. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as datasets from "@/app/api/v1/datasets/route";
import * as exportRoute from "@/app/api/v1/library/export/route";
import * as cpModels from "@/app/api/v1/models/route";
import * as versionRoute from "@/app/api/v1/versions/[id]/route";
import * as curveRoute from "@/app/api/v1/versions/[id]/curve/route";
import { closeDb, models } from "@/lib/db";
import { signInAs } from "../helpers/actors";
import { freshDatabase, tableCounts } from "../helpers/db";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";
import type { Handler } from "./matrix/types";

const version = { PATCH: versionRoute.PATCH as Handler };

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

// Invented constant-Cp solid.
const data = { segments: [{ phase: "cr", form: "constant", tminK: 250, tmaxK: 900, coeffs: { cpJ: 120 } }], reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 } };

describe("library API", () => {
  it("PATCH with a stale lockVersion answers 409 with the current version", async () => {
    await signInAs("steward");
    const created = (await bodyOf(
      await cpModels.POST(
        jsonRequest("POST", "/api/v1/models", { species: { formula: "TiO2", displayName: "Titania" }, name: "Titania", version: { data, citation: "Invented" } }),
        ctx(),
      ),
    )) as { version: { id: number } };
    const id = String(created.version.id);
    const first = await version.PATCH(jsonRequest("PATCH", `/api/v1/versions/${id}`, { lockVersion: 0, changeNote: "first" }), ctx({ id }));
    expect(first.status).toBe(200);
    await signInAs("steward2");
    const stale = await version.PATCH(jsonRequest("PATCH", `/api/v1/versions/${id}`, { lockVersion: 0, changeNote: "second" }), ctx({ id }));
    expect(stale.status).toBe(409);
    const body = (await bodyOf(stale)) as { error: { code: string; message: string; details: { current: { lockVersion: number; changeNote: string } } } };
    expect(body.error.code).toBe("conflict");
    expect(body.error.details.current).toMatchObject({ lockVersion: 1, changeNote: "first" });
  });

  it("a curve over an empty span answers 422 in the error shape", async () => {
    await signInAs("engineer");
    const v = await models().ModelVersion.findOne({ where: { status: "approved" } });
    const id = String(v!.id);
    const res = await curveRoute.GET(jsonRequest("GET", `/api/v1/versions/${id}/curve?fromK=500&toK=400`), ctx({ id }));
    expect(res.status).toBe(422);
    expect(await bodyOf(res)).toEqual({ error: { code: "invalid-request", message: "toK: the upper temperature must be above the lower one." } });
  });

  it("a CSV with bad rows is 422 with every row named, and nothing is saved", async () => {
    await signInAs("engineer");
    const before = await tableCounts();
    const res = await datasets.POST(jsonRequest("POST", "/api/v1/datasets", { name: "Bad", text: "T,Cp\n300,x\n400,31\n" }), ctx());
    expect(res.status).toBe(422);
    expect(await bodyOf(res)).toEqual({
      error: {
        code: "invalid-dataset",
        message: 'Row 2, column "Cp": "x" is not a number.',
        details: { rows: [{ row: 2, column: "Cp", message: 'Row 2, column "Cp": "x" is not a number.' }] },
      },
    });
    expect(await tableCounts()).toEqual(before);
  });

  it("export downloads a file named for what it holds and the date", async () => {
    await signInAs("reviewer");
    const res = await exportRoute.GET(jsonRequest("GET", "/api/v1/library/export?models="), ctx());
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="heatpath-library-all-sets-approved-\d{4}-\d{2}-\d{2}\.json"$/);
    const file = (await bodyOf(res)) as { models: unknown[] };
    // 60 reference models (26 + 34 from the two published files) plus Larkspur's approved team copy.
    expect(file.models).toHaveLength(61);
    // One model: its name; every version: said so.
    const ch4 = await models().CpModel.findOne({ where: { name: "CH4 · Shomate (NIST-JANAF fit)" } });
    const one = await exportRoute.GET(jsonRequest("GET", `/api/v1/library/export?models=${ch4!.id}&versions=all`), ctx());
    expect(one.headers.get("content-disposition")).toMatch(/^attachment; filename="heatpath-library-ch4-shomate-nist-janaf-fit-all-versions-\d{4}-\d{2}-\d{2}\.json"$/);
  });
});
