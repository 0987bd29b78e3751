import { describe, expect, it } from "vitest";
import { neutraliseCell, toCsv } from "@/lib/csv";

// OWASP "CSV Injection": cells starting with = + - @ tab or CR run as formulas (common practice).
describe("CSV cells", () => {
  it.each([
    ['=HYPERLINK("http://evil.example.test")', '\'=HYPERLINK("http://evil.example.test")'],
    ["+cmd|' /C calc'!A0", "'+cmd|' /C calc'!A0"],
    ["-2+3", "'-2+3"],
    ["@SUM(A1)", "'@SUM(A1)"],
    ["\t=1", "'\t=1"],
    ["-2.5", "-2.5"],
    ["-1.25e-7", "-1.25e-7"],
    ["+4", "+4"],
    ["-Infinity", "-Infinity"],
    ["CO(g)", "CO(g)"],
    ["", ""],
  ])("%j → %j", (input, output) => {
    expect(neutraliseCell(input)).toBe(output);
  });

  it("neutralises headers and cells, keeps numbers as written", () => {
    expect(
      toCsv(
        ["tK", "=x"],
        [
          [300, "=1+1"],
          [-12.5, null],
        ],
      ),
    ).toBe("tK,'=x\n300,'=1+1\n-12.5,\n");
  });
});
