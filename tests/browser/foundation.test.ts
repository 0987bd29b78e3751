import { describe, expect, it } from "vitest";
import { DEMO_ACCOUNTS } from "@/seeders/demo-accounts";
import { baseURL, openBrowser, browserForFile, shot, signIn, signOut } from "./browser";

const b = browserForFile();

const LABEL = { engineer: "Engineer", steward: "Steward", reviewer: "Reviewer", admin: "Admin" } as const;
const larkspur = DEMO_ACCOUNTS.filter((a) => a.team === "larkspur" && a.email !== "stella.steward@example.test");

describe("signed-out visitor", () => {
  it("is sent to sign-in and sees one message for a wrong password", async () => {
    const { page } = b;
    await page.goto(`${baseURL()}/cases`);
    await page.waitForURL(/\/sign-in\?next=%2Fcases/);
    await page.getByLabel("E-mail").fill("erin.engineer@example.test");
    await page.getByLabel("Password").fill("wrong-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText("That e-mail and password do not match an account.").waitFor();
    await shot(page, "sign-in-wrong-password");
  });
});

describe.each(larkspur)("demo $role", (account) => {
  it("signs in, sees the navigation and role, opens every page, signs out", async () => {
    const { page } = b;
    await signIn(page, account.email);
    expect(await page.getByTestId("user-role").textContent()).toBe(LABEL[account.role]);
    expect(await page.getByTestId("home-team").textContent()).toBe("Larkspur Hydrogen Works");
    const nav = page.getByRole("navigation", { name: "Main" });
    for (const label of ["Home", "Library", "Cases", "Reviews", "Team"]) {
      await expect(nav.getByRole("link", { name: label }).count()).resolves.toBe(1);
    }
    await shot(page, `home-${account.role}`);
    for (const [label, heading] of [
      ["Library", "Cp library"],
      ["Cases", "Cases"],
      ["Reviews", "Reviews"],
      ["Team", "Larkspur Hydrogen Works"],
    ]) {
      await nav.getByRole("link", { name: label }).click();
      await page.getByRole("heading", { level: 1, name: heading }).waitFor();
      expect(await nav.getByRole("link", { name: label }).getAttribute("aria-current")).toBe("page");
    }
    const canManage = account.role === "admin";
    expect(await page.getByRole("button", { name: "Invite" }).count()).toBe(canManage ? 1 : 0);
    await shot(page, `team-${account.role}`);
    await signOut(page);
  });
});

describe("invitation", () => {
  it("an admin invites, the invitee accepts through the link and lands in the team", async () => {
    const { page } = b;
    await signIn(page, "alex.admin@example.test");
    await page.goto(`${baseURL()}/team`);
    await page.getByLabel("E-mail address").fill("noor.newhire@example.test");
    await page.getByLabel("Role", { exact: true }).selectOption("steward");
    await page.getByRole("button", { name: "Invite" }).click();
    await page.getByText("Invitation mailed to noor.newhire@example.test.").waitFor();
    await shot(page, "team-invited");
    // The link travels only by mail: in demo mode the admin reads it in the outbox.
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Outbox" }).click();
    const message = page.getByTestId("caught-message").filter({ hasText: "noor.newhire@example.test" }).first();
    for (let i = 0; i < 20 && (await message.count()) === 0; i++) {
      await page.waitForTimeout(500);
      await page.reload();
    }
    const link = (await message.getByRole("link").first().getAttribute("href"))!;
    expect(link).toMatch(/\/invite\/[A-Za-z0-9_-]{20,}$/);
    await shot(page, "outbox-invitation");
    await signOut(page);

    const invitee = await openBrowser({ width: 390, height: 844 });
    try {
      const p = invitee.page;
      await p.goto(link);
      await p.getByRole("heading", { name: "Join Larkspur Hydrogen Works" }).waitFor();
      await p.getByLabel("Your name").fill("Noor Newhire");
      await p.getByLabel("Choose a password").fill("short");
      await p.getByRole("button", { name: "Join the team" }).click();
      await p.getByText("Use at least 10 characters.").waitFor();
      await p.getByLabel("Choose a password").fill("cold-box-90-kelvin");
      await p.getByRole("button", { name: "Join the team" }).click();
      await p.waitForURL(`${baseURL()}/`);
      expect(await p.getByTestId("user-role").textContent()).toBe("Steward");
      await shot(p, "invitee-home-phone");
      await signOut(p);
      await p.goto(link);
      await p.getByText("This invitation link is not valid", { exact: false }).waitFor();
    } finally {
      await invitee.close();
    }
  });
});
