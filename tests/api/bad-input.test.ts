import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { INVALID_CREDENTIALS } from "@/lib/services/auth";
import * as session from "@/app/api/v1/session/route";
import * as invitations from "@/app/api/v1/team/invitations/route";
import { signInAs } from "../helpers/actors";
import { cookieJar } from "../helpers/cookies";
import { freshDatabase, tableCounts } from "../helpers/db";
import { bodyOf, jsonRequest } from "../helpers/request";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

const signIn = (body: unknown, headers?: Record<string, string>) => session.POST(jsonRequest("POST", "/api/v1/session", body, headers), undefined);

describe("sign-in refusals", () => {
  it.each([
    ["wrong password", { email: "erin.engineer@example.test", password: "not-it-at-all" }, 401, "invalid-credentials", INVALID_CREDENTIALS],
    ["unknown user", { email: "ghost@example.test", password: "not-it-at-all" }, 401, "invalid-credentials", INVALID_CREDENTIALS],
    ["empty e-mail", { email: "", password: "x" }, 422, "invalid-request", "email: Enter an e-mail address."],
    ["empty password", { email: "erin.engineer@example.test", password: "" }, 422, "invalid-request", "password: Enter your password."],
    ["missing fields", {}, 422, "invalid-request", "email: Enter an e-mail address."],
    ["not an address", { email: "erin", password: "x" }, 422, "invalid-request", "email: Enter a valid e-mail address."],
    ["malformed JSON", '{"email": ', 400, "malformed-json", "The body is not valid JSON."],
    ["a JSON array", "[]", 422, "invalid-request", "Invalid input: expected object, received array"],
  ])("%s", async (_label, body, status, code, message) => {
    await signInAs("anonymous");
    // A failed attempt is counted for the rate limit, and nothing else is written.
    const { rate_limits: _attempts, ...before } = await tableCounts();
    const response = await signIn(body);
    expect(response.status).toBe(status);
    expect(await bodyOf(response)).toMatchObject({ error: { code, message } });
    const { rate_limits: _after, ...after } = await tableCounts();
    expect(after).toEqual(before);
    expect(cookieJar.getAll()).toEqual([]);
  });

  it("refuses the wrong content type with 415", async () => {
    const response = await signIn("email=a&password=b", { "content-type": "application/x-www-form-urlencoded" });
    expect(response.status).toBe(415);
    expect(await bodyOf(response)).toEqual({ error: { code: "unsupported-media-type", message: "Send the body as application/json." } });
  });

  it("refuses an oversized body with 413 and writes nothing", async () => {
    await signInAs("admin");
    const before = await tableCounts();
    const response = await invitations.POST(
      jsonRequest("POST", "/api/v1/team/invitations", { email: "big@example.test", role: "engineer", pad: "x".repeat(1_100_000) }),
      undefined,
    );
    expect(response.status).toBe(413);
    expect(await bodyOf(response)).toMatchObject({ error: { code: "body-too-large" } });
    expect(await tableCounts()).toEqual(before);
  });

  it("signs in with the right password and sets one httpOnly session cookie", async () => {
    await signInAs("anonymous");
    const response = await signIn({ email: "Erin.Engineer@example.test ", password: "larkspur-demo-2026" });
    expect(response.status).toBe(200);
    expect(await bodyOf(response)).toMatchObject({ user: { email: "erin.engineer@example.test" }, role: "engineer", team: { name: "Larkspur Hydrogen Works" } });
    expect(cookieJar.has("heatpath_session")).toBe(true);
  });
});

describe("sessions", () => {
  it("issue a new cookie at each sign-in and refuse a copied cookie after sign-out", async () => {
    const { getActor } = await import("@/lib/auth/session");
    await signInAs("anonymous");
    await signIn({ email: "rory.reviewer@example.test", password: "larkspur-demo-2026" });
    const first = cookieJar.get("heatpath_session")!.value;
    await new Promise((r) => setTimeout(r, 5));
    await signIn({ email: "rory.reviewer@example.test", password: "larkspur-demo-2026" });
    const second = cookieJar.get("heatpath_session")!.value;
    expect(second).not.toBe(first);
    expect((await getActor())?.email).toBe("rory.reviewer@example.test");

    const response = await session.DELETE(jsonRequest("DELETE", "/api/v1/session"), undefined);
    expect(response.status).toBe(204);
    expect(cookieJar.has("heatpath_session")).toBe(false);
    // Someone kept a copy of the cookie: it no longer signs anyone in.
    cookieJar.set("heatpath_session", second);
    expect(await getActor()).toBeNull();
  });
});
