import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { env } from "@/lib/env";
import * as session from "@/app/api/v1/session/route";
import { authenticate } from "@/lib/services/auth";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { freshDatabase } from "../helpers/db";
import { bodyOf, jsonRequest } from "../helpers/request";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

const wrong = (email: string, address: string) =>
  session.POST(jsonRequest("POST", "/api/v1/session", { email, password: "wrong-password-1" }, { "x-forwarded-for": `203.0.113.9, ${address}` }), undefined);

describe("sign-in rate limit", () => {
  it("answers 429 with Retry-After once an account has spent its failures, even with the right password", async () => {
    for (let i = 0; i < env.SIGNIN_LIMIT_PER_ACCOUNT; i++) expect((await wrong("sam.steward@example.test", `10.1.0.${i}`)).status).toBe(401);
    const blocked = await wrong("sam.steward@example.test", "10.1.0.99");
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(await bodyOf(blocked)).toMatchObject({ error: { code: "too-many-attempts" } });
    await expect(authenticate({ email: "sam.steward@example.test", password: DEMO_PASSWORD })).rejects.toMatchObject({ status: 429 });
  });

  it("limits one client address across accounts, keyed on the address the server saw", async () => {
    const address = "127.0.0.77";
    for (let i = 0; i < env.SIGNIN_LIMIT_PER_ADDRESS; i++) await wrong(`nobody${i}@example.test`, address);
    expect((await wrong("rory.reviewer@example.test", address)).status).toBe(429);
    // Another address is unaffected.
    expect((await wrong("rory.reviewer@example.test", "127.0.0.78")).status).toBe(401);
  });

  it("counts in the database (shared by app servers) and forgets after the window", async () => {
    const row = await models().RateLimit.findByPk("signin:account:sam.steward@example.test");
    expect(row!.count).toBe(env.SIGNIN_LIMIT_PER_ACCOUNT);
    await row!.update({ windowStartedAt: new Date(Date.now() - (env.SIGNIN_WINDOW_SECONDS + 1) * 1000) });
    await expect(authenticate({ email: "sam.steward@example.test", password: DEMO_PASSWORD })).resolves.toMatchObject({ userId: expect.any(Number) });
    expect(await models().RateLimit.findByPk("signin:account:sam.steward@example.test")).toBeNull();
  });
});
