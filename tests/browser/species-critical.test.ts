/**
 * The species page's critical constants: a steward of Larkspur sets them on the team's own
 * species (a refused value first), an engineer reads them without a form, a reference species
 * shows its cited constants read-only. Screenshot: test-results/screens/species-critical.png.
 */
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { baseURL, browserForFile, shot, signIn, signOut } from "./browser";

const b = browserForFile({ width: 1280, height: 1000 });

async function speciesId(page: Page, formula: string): Promise<number> {
  const r = await page.request.get(`${baseURL()}/api/v1/species?q=${formula}`);
  const body = (await r.json()) as { items: { id: number; formula: string; scope: string }[] };
  return body.items.find((s) => s.formula === formula)!.id;
}

describe("critical constants on the species page", () => {
  it("a steward sets them on a team species; a bad acentric factor is refused beside its field", async () => {
    const { page } = b;
    await signIn(page, "sam.steward@example.test");
    const id = await speciesId(page, "NiAl2O4");
    await page.goto(`${baseURL()}/library/species/${id}`);
    const card = page.getByTestId("critical-constants");
    await card.getByTestId("critical-none").waitFor();
    // Synthetic, invented for this test: a solid support has no meaningful gas critical point.
    await card.getByLabel("Tc (K)").fill("900");
    await card.getByLabel("pc (bar)").fill("40");
    await card.getByLabel("ω").fill("5");
    await card.getByLabel("Source").fill("Synthetic, invented for this browser test");
    await card.getByRole("button", { name: "Save constants" }).click();
    await card.getByText("An acentric factor runs from -1 to 2.").waitFor();
    expect(await card.getByLabel("Tc (K)").inputValue()).toBe("900");
    await card.getByLabel("ω").fill("0.3");
    await card.getByRole("button", { name: "Save constants" }).click();
    await card.getByText("Critical constants saved.").waitFor();
    await card.getByTestId("critical-shown").waitFor();
    expect(await card.getByTestId("critical-shown").innerText()).toContain("900 K");
    expect(await card.getByTestId("critical-citation").innerText()).toBe("Source: Synthetic, invented for this browser test");
    await shot(page, "species-critical");
    await signOut(page);
  });

  it("an engineer reads them without a form; a reference species shows its cited constants read-only", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    const id = await speciesId(page, "NiAl2O4");
    await page.goto(`${baseURL()}/library/species/${id}`);
    const card = page.getByTestId("critical-constants");
    await card.getByTestId("critical-shown").waitFor();
    expect(await card.getByRole("button", { name: "Save constants" }).count()).toBe(0);
    await page.goto(`${baseURL()}/library/species/${await speciesId(page, "NH3")}`);
    await card.getByTestId("critical-shown").waitFor();
    expect(await card.getByTestId("critical-shown").innerText()).toContain("405.4 K");
    expect(await card.getByTestId("critical-citation").innerText()).toContain("Poling");
    expect(await card.getByRole("button", { name: "Save constants" }).count()).toBe(0);
    await signOut(page);
  });

  it("the steward removes them again", async () => {
    const { page } = b;
    await signIn(page, "sam.steward@example.test");
    await page.goto(`${baseURL()}/library/species/${await speciesId(page, "NiAl2O4")}`);
    const card = page.getByTestId("critical-constants");
    await card.getByRole("button", { name: "Remove the constants" }).click();
    await card.getByTestId("critical-none").waitFor();
    await signOut(page);
  });
});
