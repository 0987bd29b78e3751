/**
 * Session cookies unsealed once per process (lib/auth/session-cache.ts): a seal iron accepted
 * is answered from memory until its own expiry; a refused, tampered or expired seal is asked
 * again; the cache is bounded. Seals are made by iron-session with a synthetic password,
 * invented for this test.
 */
import { beforeEach, describe, expect, it, vi } from "vitest";
import { sealData, unsealData } from "iron-session";
import { MAX_UNSEALED_SESSIONS, sealExpiry, unsealedSessions, unsealOnce } from "@/lib/auth/session-cache";
import { getActor, startSession } from "@/lib/auth/session";
import { cookieJar } from "../helpers/cookies";

const password = "synthetic-session-password-for-this-test-only-0123456789";
const ttl = 60 * 60;
const seal = (data: object) => sealData(data, { password, ttl });
const ironUnseal = vi.fn((s: string) => unsealData<{ userId?: number }>(s, { password, ttl }));

beforeEach(() => {
  unsealedSessions().clear();
  ironUnseal.mockClear();
});

describe("unsealOnce", () => {
  it("unseals a seal once, then answers a copy from memory", async () => {
    const s = await seal({ userId: 7 });
    const a = await unsealOnce(s, ironUnseal);
    const b = await unsealOnce(s, ironUnseal);
    expect([a, b]).toEqual([{ userId: 7 }, { userId: 7 }]);
    expect(b).not.toBe(a);
    expect(ironUnseal).toHaveBeenCalledTimes(1);
  });

  it("reads the expiry iron puts in the seal (ms since the epoch, about ttl from now)", async () => {
    const exp = sealExpiry(await seal({ userId: 1 }))!;
    expect(Math.abs(exp - (Date.now() + ttl * 1000))).toBeLessThan(5_000);
    expect(sealExpiry("not a seal")).toBeNull();
  });

  it("never keeps a refused seal, and a tampered seal is a different key that iron refuses", async () => {
    const s = await seal({ userId: 7 });
    await unsealOnce(s, ironUnseal);
    const tampered = s.replace(/\*([^*]+)\*([^*]+)$/, (_m, salt: string, mac: string) => `*${salt}*${mac.slice(0, -2)}${mac.endsWith("AA") ? "BB" : "AA"}`);
    expect(tampered).not.toBe(s);
    expect(await unsealOnce(tampered, ironUnseal)).toEqual({});
    expect(await unsealOnce(tampered, ironUnseal)).toEqual({});
    expect(ironUnseal).toHaveBeenCalledTimes(3);
    expect(unsealedSessions().size).toBe(1);
  });

  it("asks iron again once the seal has expired", async () => {
    const s = await seal({ userId: 7 });
    await unsealOnce(s, ironUnseal);
    const later = sealExpiry(s)! + 1;
    const expired = vi.fn(async () => ({}));
    expect(await unsealOnce(s, expired, later)).toEqual({});
    expect(expired).toHaveBeenCalledTimes(1);
    expect(unsealedSessions().size).toBe(0);
  });

  it("is bounded", async () => {
    const fake = vi.fn(async () => ({ userId: 1 }));
    const exp = Date.now() + 60_000;
    for (let i = 0; i < MAX_UNSEALED_SESSIONS + 10; i++) await unsealOnce(`Fe26.2*1*s*iv*data${i}*${exp}*hs*h~2`, fake);
    expect(unsealedSessions().size).toBe(MAX_UNSEALED_SESSIONS);
  });
});

describe("getActor", () => {
  it("signs in from the cookie as before, unsealing it once", async () => {
    const { actorOf } = await import("../helpers/actors");
    const { closeDb } = await import("@/lib/db");
    const { freshDatabase } = await import("../helpers/db");
    await freshDatabase();
    try {
      const erin = await actorOf("engineer");
      cookieJar.clear();
      await startSession(erin.userId, erin.teamId);
      expect(await getActor()).toEqual(erin);
      expect(unsealedSessions().size).toBe(1);
      expect(await getActor()).toEqual(erin);
      cookieJar.clear();
      expect(await getActor()).toBeNull();
    } finally {
      await closeDb();
    }
  });
});
