/** The equilibrium request through all three doors: evaluate(), the CLI (spawned) and POST /api/v1/evaluate. */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/v1/evaluate/route";
import { evaluate, type SpeciesInput } from "@/lib/thermo";
import { signInAs } from "../helpers/actors";
import { freshDatabase, tableCounts } from "../helpers/db";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";
import { repoRoot, speciesEntry } from "../thermo/reference-data";

beforeAll(() => freshDatabase());

// Shomate fits to NIST-JANAF (Chase 1998), from ../shared/reference/cp-coefficients.json; CODATA
// Key Values uncertainties for CO (from memory).
const sp = (n: string): SpeciesInput => speciesEntry("shomate-janaf", n, "g");
const request = {
  reaction: "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)",
  species: {
    "CH4(g)": sp("CH4"),
    "H2O(g)": sp("H2O"),
    "CO(g)": { ...sp("CO"), uncertainty: { dfHkJ: 0.17, sJ: 0.004 } },
    "CO2(g)": sp("CO2"),
    "H2(g)": sp("H2"),
  },
  temperatures: { fromK: "600 degC", toK: "900 degC", stepK: "100 degC" },
  equilibrium: {
    feed: { "CH4(g)": 1, "H2O(g)": 3, "N2(g)": 0.05 },
    feedUnit: "kmol/h",
    pressureBar: "2.5 MPa",
    key: "CH4(g)",
    reactions: ["CH4(g) + H2O(g) -> CO(g) + 3 H2(g)", "CO(g) + H2O(g) -> CO2(g) + H2(g)"],
  },
};

describe("equilibrium through the three doors", () => {
  it("CLI, route and engine give identical numbers", async () => {
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-eq-")), "req.json");
    fs.writeFileSync(file, JSON.stringify(request));
    const cli = spawnSync(process.execPath, ["--import", "tsx", path.join(repoRoot, "scripts/evaluate.ts"), file], { cwd: repoRoot, encoding: "utf8" });
    expect(cli.stderr).toBe("");
    expect(cli.status).toBe(0);
    await signInAs("engineer");
    const res = await POST(jsonRequest("POST", "/api/v1/evaluate", request), ctx());
    expect(res.status).toBe(200);
    const direct = JSON.parse(JSON.stringify(evaluate(request)));
    expect(await bodyOf(res)).toEqual(direct);
    expect(JSON.parse(cli.stdout)).toEqual(direct);
    expect(direct.equilibrium).toHaveLength(4);
    expect(direct.equilibriumInfo).toMatchObject({ pressureBar: 25, feedUnit: "kmol/h", key: "CH4(g)" });
    // A CLI process and the route's first engine worker each load the engine (mathjs) from cold.
  }, 60_000);
  it("a dependent set is a 422 with the error shape, and exit 2 on the CLI, writing nothing", async () => {
    const bad = { ...request, equilibrium: { ...request.equilibrium, reactions: [...request.equilibrium.reactions, "CH4(g) + 2 H2O(g) -> CO2(g) + 4 H2(g)"] } };
    const message = 'equilibrium.reactions[2] ("CH4(g) + 2 H2O(g) -> CO2(g) + 4 H2(g)") is a linear combination of the reactions before it; give linearly independent reactions';
    await signInAs("engineer");
    const before = await tableCounts();
    const res = await POST(jsonRequest("POST", "/api/v1/evaluate", bad), ctx());
    expect(res.status).toBe(422);
    expect(await bodyOf(res)).toMatchObject({ error: { code: "dependent-reactions", message } });
    expect(await tableCounts()).toEqual(before);
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-eq-")), "bad.json");
    fs.writeFileSync(file, JSON.stringify(bad));
    const cli = spawnSync(process.execPath, ["--import", "tsx", path.join(repoRoot, "scripts/evaluate.ts"), file], { cwd: repoRoot, encoding: "utf8" });
    expect(cli.status).toBe(2);
    expect(cli.stdout).toBe("");
    expect(cli.stderr).toBe(`${message} (dependent-reactions)\n`);
  });
});
