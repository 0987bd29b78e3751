import fc from "fast-check";
import { afterAll, beforeAll, describe, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import * as cpModels from "@/app/api/v1/models/route";
import * as version from "@/app/api/v1/versions/[id]/route";
import * as reject from "@/app/api/v1/versions/[id]/reject/route";
import * as preview from "@/app/api/v1/preview/route";
import * as datasets from "@/app/api/v1/datasets/route";
import * as importRoute from "@/app/api/v1/library/import/route";
import * as cases from "@/app/api/v1/cases/route";
import * as oneCase from "@/app/api/v1/cases/[id]/route";
import * as comments from "@/app/api/v1/cases/[id]/comments/route";
import * as reviews from "@/app/api/v1/cases/[id]/reviews/route";
import * as eqPreview from "@/app/api/v1/equilibrium/preview/route";
import { freshDatabase } from "../helpers/db";
import { hammer, hostileBody, nastyString, type Handler } from "../helpers/hostile";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

const anyValue = fc.oneof(fc.anything(), nastyString, fc.double(), fc.constant(null));
/** A string that can never be valid where a non-empty, bounded text is asked for. */
const invalidText = (max: number) =>
  fc.oneof(
    fc.constantFrom("", "   ", "\t\n"),
    fc.integer({ min: max + 1, max: max + 500 }).map((n) => "x".repeat(n)),
    fc.integer(),
    fc.boolean(),
    fc.constant(null),
    fc.array(fc.string()),
  );

async function ids() {
  const { ModelVersion, Case } = models();
  const draft = await ModelVersion.findOne({ where: { status: "proposed" } });
  if (!draft) throw new Error("the seeded proposal is gone: an earlier family's request was accepted");
  const submitted = await Case.findOne({ where: { status: "submitted" } });
  const own = await Case.findOne({ where: { status: "draft" } });
  return { proposal: String(draft!.id), submitted: String(submitted!.id), draftCase: String(own!.id) };
}

describe("generated hostile input to the library and cases never gets a 5xx and writes nothing", () => {
  it("new model (steward)", async () => {
    await hammer(
      "models",
      "steward",
      cpModels.POST as Handler,
      "/api/v1/models",
      "POST",
      {},
      hostileBody({ speciesId: anyValue, species: anyValue, name: anyValue, version: fc.record({ data: anyValue, citation: anyValue }, { requiredKeys: [] }) }),
    );
  });

  it("version edit with bad ids and bodies (steward)", async () => {
    const { proposal } = await ids();
    await hammer(
      "version",
      "steward",
      version.PATCH as Handler,
      `/api/v1/versions/${proposal}`,
      "PATCH",
      { id: proposal },
      hostileBody({ lockVersion: anyValue, data: anyValue, citation: anyValue }),
    );
    await hammer("version id", "steward", version.PATCH as Handler, "/api/v1/versions/..%2F..%2Fetc", "PATCH", { id: "../../etc" }, hostileBody({ lockVersion: anyValue }), 50);
  });

  it("reject without a proper reason (second steward)", async () => {
    const { proposal } = await ids();
    await hammer(
      "reject",
      "steward2",
      reject.POST as Handler,
      `/api/v1/versions/${proposal}/reject`,
      "POST",
      { id: proposal },
      hostileBody({ reason: invalidText(2000) }, { exact: true }),
    );
  });

  it("curve preview", async () => {
    await hammer(
      "preview",
      "engineer",
      preview.POST as Handler,
      "/api/v1/preview",
      "POST",
      {},
      hostileBody({ data: fc.record({ segments: fc.array(anyValue) }), fromK: anyValue, toK: anyValue, points: fc.oneof(fc.integer({ min: 401, max: 1e9 }), anyValue) }),
    );
  });

  it("dataset upload: path tricks in file names, formulas in cells", async () => {
    const csv = fc.array(fc.tuple(nastyString, nastyString), { maxLength: 20 }).map((rows) => "T (K),Cp (J/(mol K))\n" + rows.map((r) => r.join(",")).join("\n"));
    await hammer(
      "datasets",
      "steward",
      datasets.POST as Handler,
      "/api/v1/datasets",
      "POST",
      {},
      hostileBody({
        name: anyValue,
        filename: fc.oneof(nastyString, fc.constantFrom("../../../etc/passwd", "C:\\\\Windows\\\\win.ini", "a/b/../../c.csv", "\u0000.csv")),
        text: fc.oneof(csv, anyValue),
        tUnit: anyValue,
        cpUnit: anyValue,
      }),
    );
  });

  it("library import", async () => {
    await hammer(
      "import",
      "steward",
      importRoute.POST as Handler,
      "/api/v1/library/import",
      "POST",
      {},
      hostileBody({ format: fc.oneof(fc.constant("heatpath.cp-library"), anyValue), version: anyValue, models: fc.array(anyValue, { maxLength: 5 }) }),
    );
  });

  it("new case (engineer)", async () => {
    await hammer(
      "cases",
      "engineer",
      cases.POST as Handler,
      "/api/v1/cases",
      "POST",
      {},
      hostileBody({ title: invalidText(160), terms: fc.array(anyValue, { maxLength: 25 }), temperatures: anyValue, referenceK: anyValue, toleranceKJ: anyValue }),
    );
  });

  it("case edit (engineer)", async () => {
    const { draftCase } = await ids();
    await hammer(
      "case edit",
      "engineer",
      oneCase.PATCH as Handler,
      `/api/v1/cases/${draftCase}`,
      "PATCH",
      { id: draftCase },
      hostileBody({ lockVersion: anyValue, title: invalidText(160), terms: anyValue, temperatures: anyValue }),
    );
  });

  it("comments (reviewer)", async () => {
    const { submitted } = await ids();
    await hammer(
      "comments",
      "reviewer",
      comments.POST as Handler,
      `/api/v1/cases/${submitted}/comments`,
      "POST",
      { id: submitted },
      hostileBody({ body: invalidText(4000), revision: anyValue }, { exact: true }),
    );
  });

  it("review decisions (reviewer)", async () => {
    const { submitted } = await ids();
    await hammer(
      "reviews",
      "reviewer",
      reviews.POST as Handler,
      `/api/v1/cases/${submitted}/reviews`,
      "POST",
      { id: submitted },
      hostileBody(
        {
          decision: fc.oneof(
            fc.constantFrom("approve", "APPROVED", "reject", ""),
            anyValue.filter((v) => v !== "approved" && v !== "returned"),
          ),
          reason: anyValue,
          revision: anyValue,
        },
        { exact: true },
      ),
    );
  });

  it("equilibrium preview (engineer)", async () => {
    const { draftCase } = await ids();
    await hammer(
      "equilibrium",
      "engineer",
      eqPreview.POST as Handler,
      "/api/v1/equilibrium/preview",
      "POST",
      {},
      hostileBody({
        caseId: fc.oneof(fc.constant(Number(draftCase)), anyValue),
        equilibrium: fc.record({ feed: fc.dictionary(nastyString, anyValue), pressureBar: anyValue, key: anyValue }, { requiredKeys: [] }),
      }),
    );
  });
});
