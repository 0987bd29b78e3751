/** The page to return to after sign-in: only paths on this site (issue: open redirect after sign-in). */
import { describe, expect, it } from "vitest";
import { safeNext } from "@/lib/auth/client";

describe("safeNext", () => {
  it.each([
    ["/cases", "/cases"],
    ["/cases/12?tab=results#chart", "/cases/12?tab=results#chart"],
    ["/library/versions/3", "/library/versions/3"],
    ["/a/../cases", "/cases"],
  ])("keeps the local path %s", (next, expected) => {
    expect(safeNext(next)).toBe(expected);
  });

  it.each([
    // `next=/\evil.example/`: browsers read the backslash as a slash, i.e. //evil.example/
    "/\\evil.example/",
    // `next=/%09/evil.example/` arrives decoded: the tab is dropped by URL parsing, leaving //evil.example/
    "/\t/evil.example/",
    "/\n/evil.example/",
    "//evil.example",
    "//evil.example/path",
    "/\\/evil.example",
    "https://evil.example/",
    "javascript:alert(1)",
    "evil.example",
    "",
  ])("sends %j home", (next) => {
    expect(safeNext(next)).toBe("/");
  });

  it("sends undefined and null home", () => {
    expect(safeNext(undefined)).toBe("/");
    expect(safeNext(null)).toBe("/");
  });
});
