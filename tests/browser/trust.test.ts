/**
 * Against `next start` (the production build): the image optimiser is off, a reviewer gets the
 * 403 page on the case builder, a NUL search is refused, and the Outbox attack walked in chromium —
 * Tansy's admin invites addresses Larkspur already mailed and finds none of Larkspur's mail.
 */
import { describe, expect, it } from "vitest";
import { baseURL, browserForFile, shot, signIn, signOut } from "./browser";

const b = browserForFile();

async function cookieFor(email: string): Promise<string> {
  const r = await fetch(`${baseURL()}/api/v1/session`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ email, password: "larkspur-demo-2026" }),
  });
  expect(r.status).toBe(200);
  return r.headers.get("set-cookie")!.split(";")[0];
}

describe("odd requests answered with 4xx by the built app", () => {
  it.each(["/_next/image?url=/etc/passwd", "/_next/image?url=%2Fetc%2Fpasswd&w=64&q=75", "/_next/image?url=http://127.0.0.1:1/x.png&w=64&q=75"])("%s", async (path) => {
    const r = await fetch(`${baseURL()}${path}`);
    expect(r.status).toBeGreaterThanOrEqual(400);
    expect(r.status).toBeLessThan(500);
    expect(await r.text()).not.toMatch(/root:x:0:0/);
  });

  it("a reviewer opening /cases/new or a case's edit page gets the 403 page", async () => {
    const cookie = await cookieFor("rory.reviewer@example.test");
    for (const path of ["/cases/new", "/cases/1/edit"]) {
      const r = await fetch(`${baseURL()}${path}`, { headers: { cookie }, redirect: "manual" });
      expect(r.status).toBe(403);
      expect(await r.text()).toContain("Your role in this team does not allow this page.");
    }
  });

  it("a NUL byte in a search is a 422 on the API and a normal page on /library", async () => {
    const cookie = await cookieFor("erin.engineer@example.test");
    for (const path of ["/api/v1/species?q=%00", "/api/v1/models?q=%00", "/api/v1/pins?formula=%00"]) {
      expect((await fetch(`${baseURL()}${path}`, { headers: { cookie } })).status).toBe(422);
    }
    expect((await fetch(`${baseURL()}/library?q=%00`, { headers: { cookie } })).status).toBe(200);
  });
});

describe("the Outbox across teams (walked in chromium)", () => {
  it("Tansy's admin invites a Larkspur invitee and a Larkspur member, and sees only Tansy's own mail", async () => {
    const { page } = b;
    // Larkspur invites someone first: that mail holds Larkspur's invitation link.
    await signIn(page, "alex.admin@example.test");
    await page.goto(`${baseURL()}/team`);
    await page.getByLabel("E-mail address").fill("nell.newcomer@example.test");
    await page.getByLabel("Role", { exact: true }).selectOption("steward");
    await page.getByRole("button", { name: "Invite" }).click();
    await page.getByText("Invitation mailed to nell.newcomer@example.test.").waitFor();
    await signOut(page);

    await signIn(page, "tom.tansy@example.test");
    for (const email of ["nell.newcomer@example.test", "erin.engineer@example.test"]) {
      await page.goto(`${baseURL()}/team`);
      await page.getByLabel("E-mail address").fill(email);
      await page.getByRole("button", { name: "Invite" }).click();
      await page.getByText(`Invitation mailed to ${email}.`).waitFor();
    }
    await page.goto(`${baseURL()}/outbox`);
    const messages = page.getByTestId("caught-message");
    for (let i = 0; i < 30 && (await messages.count()) < 2; i++) {
      await page.waitForTimeout(500);
      await page.reload();
    }
    await shot(page, "outbox-tansy-admin");
    expect(await messages.count()).toBe(2);
    const text = await page.locator("main").innerText();
    expect(text).not.toContain("Larkspur");
    expect(text).toContain("Join Tansy Gas Cooperative on Heatpath");
    await signOut(page);

    // Larkspur's admin still reads Larkspur's invitation and none of Tansy's.
    await signIn(page, "alex.admin@example.test");
    await page.goto(`${baseURL()}/outbox`);
    const own = page.getByTestId("caught-message").filter({ hasText: "nell.newcomer@example.test" });
    for (let i = 0; i < 30 && (await own.count()) === 0; i++) {
      await page.waitForTimeout(500);
      await page.reload();
    }
    await shot(page, "outbox-larkspur-admin");
    expect(await page.locator("main").innerText()).not.toContain("Tansy");
    await signOut(page);
  });
});

describe("four-eyes on the version page (walked in chromium)", () => {
  it("a steward who edited a draft sees no decision buttons; another steward approves it with the button", async () => {
    const { page } = b;
    const json = (cookie: string) => ({ cookie, "content-type": "application/json" });
    const erin = await cookieFor("erin.engineer@example.test");
    const sam = await cookieFor("sam.steward@example.test");
    // Constant Cp of a solid with an anchor: synthetic, invented for this test.
    const data = { segments: [{ phase: "cr", form: "constant", tminK: 250, tmaxK: 900, coeffs: { cpJ: 120 } }], reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 } };
    const created = await fetch(`${baseURL()}/api/v1/models`, {
      method: "POST",
      headers: json(erin),
      body: JSON.stringify({ species: { formula: "ZrO2", displayName: "Zirconia" }, name: "Four-eyes walk", version: { data, citation: "Invented for the browser test" } }),
    });
    expect(created.status).toBe(201);
    const id = ((await created.json()) as { version: { id: number } }).version.id;
    const edited = await fetch(`${baseURL()}/api/v1/versions/${id}`, {
      method: "PATCH",
      headers: json(sam),
      body: JSON.stringify({ lockVersion: 0, data: { ...data, segments: [{ ...data.segments[0], coeffs: { cpJ: 999 } }] } }),
    });
    expect(edited.status).toBe(200);
    expect((await fetch(`${baseURL()}/api/v1/versions/${id}/propose`, { method: "POST", headers: { cookie: erin } })).status).toBe(200);
    expect((await fetch(`${baseURL()}/api/v1/versions/${id}/approve`, { method: "POST", headers: { cookie: sam } })).status).toBe(403);

    await signIn(page, "sam.steward@example.test");
    await page.goto(`${baseURL()}/library/versions/${id}`);
    await page.getByTestId("own-work-note").waitFor();
    expect(await page.getByRole("button", { name: "Approve" }).count()).toBe(0);
    expect(await page.getByTestId("contributors").innerText()).toContain("Sam Lindqvist (edited)");
    await shot(page, "version-editor-cannot-approve");
    await signOut(page);

    await signIn(page, "stella.steward@example.test");
    await page.goto(`${baseURL()}/library/versions/${id}`);
    await page.getByRole("button", { name: "Approve" }).click();
    // The server action approves; the page refreshes to show who decided.
    await page.getByText("Decided by").waitFor();
    expect(await page.locator("main").innerText()).toContain("Stella Marsh");
    expect(await page.getByTestId("not-approved-note").count()).toBe(0);
    await shot(page, "version-approved-by-second-steward");
    await signOut(page);
  });
});
