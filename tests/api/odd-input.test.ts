/**
 * Odd input that used to end in a 500 or be stored wrong: a NUL byte in searches, a reviewer
 * opening the case builder, a CSV cell of 900 000 digits, feed keys that name no species of the
 * reaction, and line breaks in titles. Every value here is synthetic, invented for this test.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as species from "@/app/api/v1/species/route";
import * as cpModels from "@/app/api/v1/models/route";
import * as pins from "@/app/api/v1/pins/route";
import * as cases from "@/app/api/v1/cases/route";
import * as datasets from "@/app/api/v1/datasets/route";
import * as preview from "@/app/api/v1/equilibrium/preview/route";
import * as saveEquilibrium from "@/app/api/v1/equilibrium/cases/[id]/route";
import LibraryPage from "@/app/(app)/library/page";
import NewCasePage from "@/app/(app)/cases/new/page";
import EditCasePage from "@/app/(app)/cases/[id]/edit/page";
import { closeDb } from "@/lib/db";
import { createCase } from "@/lib/services/cases";
import { caseInputSchema } from "@/lib/validation/cases";
import { actorOf, signInAs } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase, tableCounts } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";

type Refusal = { error: { code: string; message: string; details?: { fields?: Record<string, string>; rows?: { row: number; column?: string; message: string }[] } } };

let refs: Record<RefFormula, number>;
beforeAll(async () => {
  await freshDatabase();
  refs = await ensureReferenceLibrary();
});
afterAll(() => closeDb());

const get = (handler: (r: Request, c: ReturnType<typeof ctx>) => Promise<Response>, url: string) => handler(jsonRequest("GET", url), ctx());

describe("a NUL byte in a search", () => {
  it.each([
    ["species", species.GET, "/api/v1/species?q=%00"],
    ["models", cpModels.GET, "/api/v1/models?q=%00"],
    ["models (NUL inside text)", cpModels.GET, "/api/v1/models?q=CH%004"],
    ["pins", pins.GET, "/api/v1/pins?formula=%00"],
  ])("%s: refused with 422, not a database error", async (_name, handler, url) => {
    await signInAs("engineer");
    const res = await get(handler as never, url);
    expect(res.status).toBe(422);
    expect(((await bodyOf(res)) as Refusal).error.message).toMatch(/control characters/);
  });

  it("the library page with ?q=%00 renders (the bad filter falls back to the whole list)", async () => {
    await signInAs("engineer");
    await expect(LibraryPage({ searchParams: Promise.resolve({ q: "\0" }) } as never)).resolves.toBeTruthy();
  });
});

describe("a reviewer opening the case builder", () => {
  it("gets the 403 page for /cases/new and /cases/<id>/edit, not the error page", async () => {
    // forbidden() is enabled by next.config's experimental.authInterrupts; this is what next sets from it.
    process.env.__NEXT_EXPERIMENTAL_AUTH_INTERRUPTS = "true";
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(refs)));
    await signInAs("reviewer");
    await expect(NewCasePage()).rejects.toMatchObject({ digest: "NEXT_HTTP_ERROR_FALLBACK;403" });
    await expect(EditCasePage({ params: Promise.resolve({ id: String(c.id) }) })).rejects.toMatchObject({ digest: "NEXT_HTTP_ERROR_FALLBACK;403" });
  });
});

describe("a CSV cell of 900 000 digits", () => {
  it.each([
    ["Cp", `T (K),Cp (J/mol/K)\n300,100\n400,${"9".repeat(900_000)}\n500,118\n600,124\n`, 3, "Cp (J/mol/K)", /too large to be a heat capacity/],
    ["T", `T (K),Cp (J/mol/K)\n300,100\n${"4".repeat(900_000)},110\n500,118\n600,124\n`, 3, "T (K)", /too large to be a temperature/],
  ])("in %s is refused at upload with that row's error, and nothing is stored", async (_what, text, row, column, message) => {
    await signInAs("steward");
    const before = await tableCounts();
    const res = await datasets.POST(jsonRequest("POST", "/api/v1/datasets", { name: "Huge cell", text }), ctx());
    expect(res.status).toBe(422);
    const body = (await bodyOf(res)) as Refusal;
    expect(body.error.code).toBe("invalid-dataset");
    expect(body.error.details!.rows).toEqual([{ row, column, message: expect.stringMatching(message) }]);
    // The message quotes a short prefix of the cell, not 900 000 characters.
    expect(body.error.message.length).toBeLessThan(200);
    expect(await tableCounts()).toEqual(before);
  });
});

describe("equilibrium feed keys", () => {
  // Shift converter feed, amounts synthetic; "C0(g)" is a typo for CO(g), "Ar(g)" an undeclared rider.
  const feed = { "CO(g)": 1, "H2O(g)": 3, "CO2(g)": 0.1, "H2(g)": 0.5 };
  const eq = (over: Record<string, unknown>) => ({ feed, feedUnit: "kmol/h", pressure: "30 bar", key: "CO(g)", reactions: [], extraTerms: [], ...over });

  it("that are not species of the reaction nor a stated inert are refused with a field error per key", async () => {
    await signInAs("engineer");
    const before = await tableCounts();
    const res = await cases.POST(jsonRequest("POST", "/api/v1/cases", shiftCase(refs, { equilibrium: eq({ feed: { ...feed, "C0(g)": 2, "Ar(g)": 1 } }) as never })), ctx());
    expect(res.status).toBe(422);
    const fields = ((await bodyOf(res)) as Refusal).error.details!.fields!;
    expect(fields["equilibrium.feed.C0(g)"]).toBe('"C0(g)" is not a species of the reaction(s); list it as an inert species if it only rides along.');
    expect(fields["equilibrium.feed.Ar(g)"]).toMatch(/not a species of the reaction/);
    expect(await tableCounts()).toEqual(before);
  });

  it("a stated inert rides along; an inert that is in the reaction, or not in the feed, is refused", async () => {
    await signInAs("engineer");
    const ok = await cases.POST(jsonRequest("POST", "/api/v1/cases", shiftCase(refs, { equilibrium: eq({ feed: { ...feed, "Ar(g)": 1 }, inert: ["Ar(g)"] }) as never })), ctx());
    expect(ok.status).toBe(201);
    const bad = await cases.POST(jsonRequest("POST", "/api/v1/cases", shiftCase(refs, { equilibrium: eq({ inert: ["CO(g)", "N2(g)"] }) as never })), ctx());
    expect(bad.status).toBe(422);
    const fields = ((await bodyOf(bad)) as Refusal).error.details!.fields!;
    expect(fields["equilibrium.inert.0"]).toMatch(/takes part in the reaction/);
    expect(fields["equilibrium.inert.1"]).toMatch(/no amount in the feed/);
  });

  it("are checked the same way by the equilibrium trial run and by saving the equilibrium", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(refs)));
    await signInAs("engineer");
    const trial = await preview.POST(jsonRequest("POST", "/api/v1/equilibrium/preview", { caseId: c.id, equilibrium: eq({ feed: { ...feed, "C0(g)": 2 } }) }), ctx());
    expect(trial.status).toBe(422);
    expect(((await bodyOf(trial)) as Refusal).error.details!.fields!["equilibrium.feed.C0(g)"]).toMatch(/not a species/);
    const save = await saveEquilibrium.PUT(
      jsonRequest("PUT", `/api/v1/equilibrium/cases/${c.id}`, { lockVersion: c.lockVersion, equilibrium: eq({ feed: { ...feed, "C0(g)": 2 } }) }),
      ctx({ id: String(c.id) }) as never,
    );
    expect(save.status).toBe(422);
    expect(((await bodyOf(save)) as Refusal).error.details!.fields!["equilibrium.feed.C0(g)"]).toMatch(/not a species/);
  });
});

describe("CR/LF in titles and names", () => {
  const solidData = { segments: [{ phase: "cr", form: "constant", tminK: 250, tmaxK: 900, coeffs: { cpJ: 120 } }], reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 } };
  it.each([
    ["case title", () => cases.POST(jsonRequest("POST", "/api/v1/cases", shiftCase(refs, { title: "Shift check\r\nBcc: someone@example.test" })), ctx()), "title"],
    [
      "model name",
      () =>
        cpModels.POST(
          jsonRequest("POST", "/api/v1/models", {
            species: { formula: "Al2O3", displayName: "Alumina" },
            name: "Alumina\nfake line",
            version: { data: solidData, citation: "Invented" },
          }),
          ctx(),
        ),
      "name",
    ],
    ["species display name", () => species.POST(jsonRequest("POST", "/api/v1/species", { formula: "C9H20", displayName: "Nonane\r\n" + "x" }), ctx()), "displayName"],
    ["dataset name", () => datasets.POST(jsonRequest("POST", "/api/v1/datasets", { name: "Run\n7", text: "T,Cp\n300,100\n400,110\n" }), ctx()), "name"],
  ])("%s with a line break is refused with a field error", async (_what, call, field) => {
    await signInAs("steward");
    const before = await tableCounts();
    const res = await call();
    expect(res.status).toBe(422);
    expect(((await bodyOf(res)) as Refusal).error.details!.fields![field]).toBe("Use one line: no line breaks or control characters.");
    expect(await tableCounts()).toEqual(before);
  });
});
