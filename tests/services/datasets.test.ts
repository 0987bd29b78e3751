/**
 * Measured-data uploads: CSV rules (exact messages, nothing saved on refusal), units,
 * limits, checksum, fitting through the engine and saving the fit as a linked draft.
 * The data points are synthetic, invented for this test (tests/helpers/library.ts); the fits are
 * anchored on the MgO(cr) values of CODATA (from memory, see MGO_ANCHOR there).
 */
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseDatasetCsv } from "@/lib/datasets/csv";
import { closeDb } from "@/lib/db";
import * as ds from "@/lib/services/datasets";
import * as lib from "@/lib/services/library";
import { computeCurve } from "@/lib/thermo/curve";
import { DATASET_MAX_ROWS } from "@/lib/validation/library";
import { actorOf } from "../helpers/actors";
import { freshDatabase, tableCounts } from "../helpers/db";
import { MAGNESIA, MGO_ANCHOR, syntheticCp as mk, syntheticCpCsv as exact } from "../helpers/library";
import { refusal } from "../helpers/refusal";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

describe("CSV rules", () => {
  it("refuses bad rows with row and column, and saves nothing", async () => {
    const sam = await actorOf("steward");
    const text = ["T (K),Cp (J/mol/K),sigma", "300,100,0.5", "350,abc,0.5", "", "-10,105,0.5", "450,-3,0.5", "500", "550,120,zero", "600,125,-1"].join("\n");
    const before = await tableCounts();
    const e = await refusal(ds.uploadDataset(sam, { name: "Bad run", text }));
    expect(e.status).toBe(422);
    expect(e.code).toBe("invalid-dataset");
    expect((e.details as { rows: unknown[] }).rows).toEqual([
      { row: 3, column: "Cp (J/mol/K)", message: 'Row 3, column "Cp (J/mol/K)": "abc" is not a number.' },
      { row: 5, column: "T (K)", message: 'Row 5, column "T (K)": -10 K is at or below 0 K.' },
      { row: 6, column: "Cp (J/mol/K)", message: 'Row 6, column "Cp (J/mol/K)": a heat capacity must be positive (got -3).' },
      { row: 7, message: "Row 7: expected 3 columns, found 1." },
      { row: 8, column: "sigma", message: 'Row 8, column "sigma": "zero" is not a number.' },
      { row: 9, column: "sigma", message: 'Row 9, column "sigma": an uncertainty must be positive (got -1).' },
    ]);
    expect(e.message).toBe('Row 3, column "Cp (J/mol/K)": "abc" is not a number. (and 5 more problems)');
    expect(await tableCounts()).toEqual(before);
  });

  it("refuses a header without a Cp column, an empty file, too many rows, non-UTF-8 text and more than 1 MB", () => {
    expect(parseDatasetCsv("T,heat\n300,1").errors[0].message).toBe("Row 1 is a header without a Cp column (Cp or Heat capacity).");
    expect(parseDatasetCsv("T,Cp\n").errors[0].message).toBe("The file holds no data rows.");
    const many = ["T,Cp", ...Array.from({ length: DATASET_MAX_ROWS + 1 }, (_, i) => `${300 + i * 0.1},30`)].join("\n");
    expect(parseDatasetCsv(many).errors[0].message).toBe(`The file has ${DATASET_MAX_ROWS + 1} data rows; at most ${DATASET_MAX_ROWS} are accepted.`);
    const latin1 = new TextDecoder("utf-8").decode(Buffer.from("T,Cp\n300,29.1\n# r\xe9sum\xe9\n", "latin1"));
    expect(parseDatasetCsv(latin1).errors[0].message).toBe("The file is not UTF-8 text: row 3 holds a character that could not be decoded. Save it as CSV UTF-8 and try again.");
    expect(parseDatasetCsv("T,Cp\n300,1\n", {}, 1024 * 1024 + 1).errors[0].message).toBe("The file is 1.00 MB; at most 1 MB is accepted.");
  });

  it("reads units from the header (°C, cal), or as chosen, and a tab-separated spreadsheet paste", () => {
    const c = parseDatasetCsv("T (°C),Cp (cal/mol/K)\n26.85,7\n126.85,7.2\n");
    expect([c.tUnit, c.cpUnit, c.unitSource]).toEqual(["degC", "cal/(mol*K)", { t: "header", cp: "header" }]);
    // 26.85 °C = 300 K; thermochemical calorie 4.184 J (common practice)
    expect(c.points[0].tK).toBeCloseTo(300, 10);
    expect(c.points[0].cpJ).toBeCloseTo(29.288, 10);
    const pasted = parseDatasetCsv("300\t29.1\n400\t29.3\n", { tUnit: "degF", cpUnit: "kJ/(mol*K)" });
    expect([pasted.tUnit, pasted.unitSource.t]).toEqual(["degF", "chosen"]);
    expect(pasted.points[1]).toEqual({ tK: ((400 - 32) * 5) / 9 + 273.15, cpJ: 29300 });
  });
});

describe("upload, fit, save as draft", () => {
  it("stores SI points with a SHA-256, fits Maier–Kelley back exactly, saves a linked draft", async () => {
    const sam = await actorOf("steward");
    const erin = await actorOf("engineer");
    const dataset = await ds.uploadDataset(erin, { name: "Exact run", filename: "exact.csv", text: exact, species: MAGNESIA });
    expect(dataset).toMatchObject({
      pointCount: 13,
      rangeK: [300, 900],
      tUnit: "K",
      sizeBytes: Buffer.byteLength(exact),
      sha256: crypto.createHash("sha256").update(exact).digest("hex"),
    });
    // Engineers upload; fitting is steward work.
    expect((await refusal(ds.fitDataset(erin, dataset.id, { form: "maier-kelley" }))).status).toBe(403);
    const fit = await ds.fitDataset(sam, dataset.id, { form: "maier-kelley", phase: "cr", reference: MGO_ANCHOR });
    // The synthetic curve's own coefficients, back from noise-free data (round-off allowance, common practice).
    expect(fit.coefficients.a).toBeCloseTo(40, 8);
    expect(fit.coefficients.b).toBeCloseTo(0.02, 10);
    expect(fit.coefficients.c / -2e5).toBeCloseTo(1, 8);
    expect(fit.rmsJ).toBeLessThan(1e-9);
    expect(fit.residuals).toHaveLength(13);
    // No phase asked and none on the dataset: refused, never a silent "cr".
    expect((await refusal(ds.fitDataset(sam, dataset.id, { form: "maier-kelley", tminK: 400, tmaxK: 800 }))).message).toBe(
      "phase: say which phase the measurements are for (cr, l or g); the dataset does not say.",
    );
    const ranged = await ds.fitDataset(sam, dataset.id, { form: "maier-kelley", phase: "cr", tminK: 400, tmaxK: 800 });
    expect([ranged.points, ranged.tminK, ranged.tmaxK, ranged.data]).toEqual([9, 400, 800, null]);

    const e = await refusal(ds.saveFitAsDraft(sam, dataset.id, { fit: { form: "nasa7", phase: "cr" }, citation: "Synthetic, invented for this test" }));
    expect(e.message).toBe("reference: enter H (kJ/mol) and S (J/(mol·K)) at the reference temperature, so the fitted model can give H and S as well as Cp.");
    const draft = await ds.saveFitAsDraft(sam, dataset.id, { fit: { form: "maier-kelley", phase: "cr", reference: MGO_ANCHOR }, citation: "Synthetic, invented for this test" });
    expect(draft).toMatchObject({ status: "draft", datasetId: dataset.id, versionNumber: 1, model: { family: "measured", name: "MgO · fitted to Exact run" } });
    // MGO_ANCHOR, stored with the phase of the fit.
    expect(draft.data.reference).toEqual({ tK: 298.15, phase: "cr", hkJ: -601.6, sJ: 26.95 });
    const curve = computeCurve(draft.data, { fromK: 300, toK: 900, points: 7 });
    expect(curve.points[2].cpJ).toBeCloseTo(mk(500), 8);
    expect((await lib.versionAudit(sam, draft.id)).map((a) => a.action)).toEqual(["model-version.fitted"]);
  });

  it("a dataset uploaded with its phase is fitted in that phase when the fit does not say", async () => {
    const sam = await actorOf("steward");
    const dataset = await ds.uploadDataset(sam, { name: "Gas run", text: exact, species: MAGNESIA, phase: "g" });
    expect(dataset.phase).toBe("g");
    const draft = await ds.saveFitAsDraft(sam, dataset.id, { fit: { form: "maier-kelley", reference: MGO_ANCHOR }, citation: "Synthetic, invented for this test" });
    expect(draft.data.segments[0].phase).toBe("g");
    expect(draft.data.reference?.phase).toBe("g");
  });

  it("another team cannot see or fit Larkspur's dataset", async () => {
    const tom = await actorOf("other");
    const [first] = await ds.listDatasets(await actorOf("steward"));
    expect((await refusal(ds.getDataset(tom, first.id))).status).toBe(404);
    expect((await refusal(ds.fitDataset(tom, first.id, { form: "maier-kelley" }))).status).toBe(404);
  });
});
