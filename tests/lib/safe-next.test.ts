import { describe, expect, it } from "vitest";
import { safeNext } from "@/lib/auth/safe-next";

describe("the path after sign-in stays on this site (open redirect)", () => {
  it.each(["/\\evil.example/", "/%09/evil.example/", "/\t/evil.example/", "//evil.example/", "https://evil.example/", "/\\/evil.example", "", "evil.example", "/\n/evil.example"])(
    "refuses %j",
    (next) => {
      expect(safeNext(next)).toBe("/");
    },
  );
  it.each(["/", "/cases/12", "/library?q=N2#v3", "/cases/new?from=%2Fcases"])("keeps the local path %j", (next) => {
    expect(safeNext(next)).toBe(next);
  });
});
