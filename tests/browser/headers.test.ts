import { describe, expect, it } from "vitest";
import { baseURL } from "./browser";

// What `next start` actually sends (the production build), page and API alike.
describe("security headers", () => {
  it.each(["/sign-in", "/api/v1/health"])("on %s", async (path) => {
    const r = await fetch(`${baseURL()}${path}`);
    const csp = r.headers.get("content-security-policy") ?? "";
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).not.toContain("unsafe-eval");
    expect(r.headers.get("x-content-type-options")).toBe("nosniff");
    expect(r.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    expect(r.headers.get("x-frame-options")).toBe("DENY");
    expect(r.headers.get("x-powered-by")).toBeNull();
  });

  it("sets the session cookie httpOnly and SameSite=Lax", async () => {
    const r = await fetch(`${baseURL()}/api/v1/session`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: "erin.engineer@example.test", password: "larkspur-demo-2026" }),
    });
    const cookie = r.headers.get("set-cookie") ?? "";
    expect(cookie).toMatch(/^heatpath_session=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it("answers a cross-site write with 403 and a malformed body without internals", async () => {
    const signIn = await fetch(`${baseURL()}/api/v1/session`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: "erin.engineer@example.test", password: "larkspur-demo-2026" }),
    });
    const cookie = signIn.headers.get("set-cookie")!.split(";")[0];
    const cross = await fetch(`${baseURL()}/api/v1/evaluate`, {
      method: "POST",
      headers: { cookie, origin: "http://evil.example.test", "content-type": "application/json" },
      body: "{}",
    });
    expect(cross.status).toBe(403);
    const bad = await fetch(`${baseURL()}/api/v1/evaluate`, { method: "POST", headers: { cookie, "content-type": "application/json" }, body: '{"reaction": ' });
    expect(bad.status).toBe(400);
    const text = await bad.text();
    expect(text).not.toMatch(/at \w+ \(|\.ts:\d+|SQLITE|SELECT /);
  });
});

// Nonce-based CSP from proxy.ts, and API answers that are never cached (issue: trust, item 11).
describe("nonce-based CSP and no-store", () => {
  it("allows only this response's nonce for scripts: no 'unsafe-inline', a fresh nonce each time, on every script tag", async () => {
    const one = await fetch(`${baseURL()}/sign-in`);
    const two = await fetch(`${baseURL()}/sign-in`);
    const scriptSrc = (r: Response) =>
      (r.headers.get("content-security-policy") ?? "")
        .split(";")
        .map((d) => d.trim())
        .find((d) => d.startsWith("script-src")) ?? "";
    expect(scriptSrc(one)).toMatch(/^script-src 'self' 'nonce-[A-Za-z0-9+/=]{20,}' 'strict-dynamic'$/);
    expect(scriptSrc(one)).not.toContain("unsafe-inline");
    expect(scriptSrc(one)).not.toBe(scriptSrc(two));
    const nonce = /'nonce-([^']+)'/.exec(scriptSrc(one))![1];
    const html = await one.text();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
  });

  it("demo mode sends no Strict-Transport-Security (it serves plain HTTP on 127.0.0.1)", async () => {
    expect((await fetch(`${baseURL()}/sign-in`)).headers.get("strict-transport-security")).toBeNull();
  });

  it("API JSON, errors and the CSV export carry Cache-Control: no-store", async () => {
    const signIn = await fetch(`${baseURL()}/api/v1/session`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: "erin.engineer@example.test", password: "larkspur-demo-2026" }),
    });
    const cookie = signIn.headers.get("set-cookie")!.split(";")[0];
    expect(signIn.headers.get("cache-control")).toBe("no-store");
    expect((await fetch(`${baseURL()}/api/v1/health`)).headers.get("cache-control")).toBe("no-store");
    expect((await fetch(`${baseURL()}/api/v1/me`, { headers: { cookie } })).headers.get("cache-control")).toBe("no-store");
    expect((await fetch(`${baseURL()}/api/v1/me`)).headers.get("cache-control")).toBe("no-store"); // 401
    const cases = (await (await fetch(`${baseURL()}/api/v1/cases`, { headers: { cookie } })).json()) as { id: number }[] | { cases: { id: number }[] };
    const list = Array.isArray(cases) ? cases : cases.cases;
    const csv = await fetch(`${baseURL()}/api/v1/cases/${list[0].id}/export`, { headers: { cookie } });
    expect(csv.status).toBe(200);
    expect(csv.headers.get("content-type")).toContain("text/csv");
    expect(csv.headers.get("cache-control")).toBe("no-store");
  });
});
