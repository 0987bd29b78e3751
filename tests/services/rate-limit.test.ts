import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

// A low per-account ceiling so the test reaches it quickly (the default is 200).
vi.hoisted(() => {
  process.env.SIGNIN_CEILING_PER_ACCOUNT = "25";
});

const { closeDb, models } = await import("@/lib/db");
const { env } = await import("@/lib/env");
const session = await import("@/app/api/v1/session/route");
const { authenticate } = await import("@/lib/services/auth");
const { clientAddress } = await import("@/lib/auth/client");
const { PEER_HEADER, peerHeaderValue } = await import("@/lib/auth/peer-address");
const { DEMO_PASSWORD } = await import("@/seeders/demo-accounts");
const { freshDatabase } = await import("../helpers/db");
const { bodyOf, jsonRequest } = await import("../helpers/request");

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

/** A sign-in from socket address `address`, with a client-written X-Forwarded-For that must not matter. */
const attempt = (email: string, address: string, password = "wrong-password-1", forwardedFor = "203.0.113.9") =>
  session.POST(jsonRequest("POST", "/api/v1/session", { email, password }, { "x-forwarded-for": forwardedFor, [PEER_HEADER]: peerHeaderValue(address) }), undefined);

describe("sign-in rate limit", () => {
  it("limits an account per address: a stranger's failures do not lock the owner out from their own address", async () => {
    for (let i = 0; i < env.SIGNIN_LIMIT_PER_ACCOUNT; i++) expect((await attempt("sam.steward@example.test", "10.1.0.1")).status).toBe(401);
    const blocked = await attempt("sam.steward@example.test", "10.1.0.1", DEMO_PASSWORD);
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(await bodyOf(blocked)).toMatchObject({ error: { code: "too-many-attempts" } });
    // The owner, from another address, signs in.
    expect((await attempt("sam.steward@example.test", "10.1.0.2", DEMO_PASSWORD)).status).toBe(200);
  });

  it("keeps a much higher ceiling per account across addresses", async () => {
    const email = "rory.reviewer@example.test";
    let n = 0;
    for (let a = 0; n < env.SIGNIN_CEILING_PER_ACCOUNT; a++) {
      for (let i = 0; i < env.SIGNIN_LIMIT_PER_ACCOUNT && n < env.SIGNIN_CEILING_PER_ACCOUNT; i++, n++) expect((await attempt(email, `10.2.0.${a}`)).status).toBe(401);
    }
    expect((await attempt(email, "10.2.0.200", DEMO_PASSWORD)).status).toBe(429);
  });

  it("limits one socket address across accounts; a spoofed X-Forwarded-For changes nothing", async () => {
    const address = "127.0.0.77";
    for (let i = 0; i < env.SIGNIN_LIMIT_PER_ADDRESS; i++) await attempt(`nobody${i}@example.test`, address, "wrong-password-1", `198.51.100.${i}`);
    expect((await attempt("erin.engineer@example.test", address, DEMO_PASSWORD, "198.51.100.250")).status).toBe(429);
    // Another socket address is unaffected.
    expect((await attempt("erin.engineer@example.test", "127.0.0.78")).status).toBe(401);
  }, 90_000); // 50 bcrypt checks one after another

  it("evaluates at most the limit of 40 wrong passwords sent at once (counted before the password check)", async () => {
    const results = await Promise.all(Array.from({ length: 40 }, () => attempt("nora.newcomer@example.test", "10.3.0.1")));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 401)).toHaveLength(env.SIGNIN_LIMIT_PER_ACCOUNT);
    expect(statuses.filter((s) => s === 429)).toHaveLength(40 - env.SIGNIN_LIMIT_PER_ACCOUNT);
  });

  it("counts in the database (shared by app servers) and forgets after the window", async () => {
    const key = "signin:account-address:sam.steward@example.test|10.1.0.1";
    const row = await models().RateLimit.findByPk(key);
    expect(row!.count).toBe(env.SIGNIN_LIMIT_PER_ACCOUNT);
    await row!.update({ windowStartedAt: new Date(Date.now() - (env.SIGNIN_WINDOW_SECONDS + 1) * 1000) });
    await expect(authenticate({ email: "sam.steward@example.test", password: DEMO_PASSWORD }, { clientAddress: "10.1.0.1" })).resolves.toMatchObject({
      userId: expect.any(Number),
    });
    expect(await models().RateLimit.findByPk(key)).toBeNull();
  });
});

describe("client address", () => {
  const headers = (forwardedFor: string | null, socket: string | null, extra: Record<string, string> = {}) => {
    const h = new Headers(extra);
    if (forwardedFor !== null) h.set("x-forwarded-for", forwardedFor);
    if (socket !== null) h.set(PEER_HEADER, peerHeaderValue(socket));
    return h;
  };

  it("is the socket address unless TRUST_PROXY is set", () => {
    expect(clientAddress(headers("203.0.113.9", "127.0.0.1"), "")).toBe("127.0.0.1");
    expect(clientAddress(headers(null, "::ffff:192.0.2.4"), "")).toBe("192.0.2.4");
    // A client cannot write the socket header itself: without this process's token it is ignored.
    expect(clientAddress(new Headers({ [PEER_HEADER]: "guess 192.0.2.1", "x-forwarded-for": "192.0.2.1" }), "")).toBeNull();
  });

  it("with a number of hops, takes the address that many places left of the socket", () => {
    // client 198.51.100.7 → proxy A 10.0.0.1 → proxy B (socket 10.0.0.2); the client prepended a spoofed entry.
    expect(clientAddress(headers("6.6.6.6, 198.51.100.7, 10.0.0.1", "10.0.0.2"), "2")).toBe("198.51.100.7");
    expect(clientAddress(headers("6.6.6.6, 198.51.100.7", "10.0.0.2"), "1")).toBe("198.51.100.7");
    // Fewer entries than hops: the leftmost.
    expect(clientAddress(headers(null, "10.0.0.2"), "3")).toBe("10.0.0.2");
  });

  it("with a list of proxy addresses, skips those from the right", () => {
    expect(clientAddress(headers("6.6.6.6, 198.51.100.7, 10.0.0.1", "10.0.0.2"), "10.0.0.1,10.0.0.2")).toBe("198.51.100.7");
    // A socket that is not a listed proxy is the client, whatever the header says.
    expect(clientAddress(headers("198.51.100.7", "192.0.2.50"), "10.0.0.1,10.0.0.2")).toBe("192.0.2.50");
  });
});
