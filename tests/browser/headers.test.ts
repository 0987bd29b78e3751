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
    const cross = await fetch(`${baseURL()}/api/v1/evaluate`, { method: "POST", headers: { cookie, origin: "http://evil.example.test", "content-type": "application/json" }, body: "{}" });
    expect(cross.status).toBe(403);
    const bad = await fetch(`${baseURL()}/api/v1/evaluate`, { method: "POST", headers: { cookie, "content-type": "application/json" }, body: "{\"reaction\": " });
    expect(bad.status).toBe(400);
    const text = await bad.text();
    expect(text).not.toMatch(/at \w+ \(|\.ts:\d+|SQLITE|SELECT /);
  });
});
