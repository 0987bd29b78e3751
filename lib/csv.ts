import Papa from "papaparse";

const FORMULA_START = /^[=+\-@\t\r]/;
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$|^[+-]?Infinity$|^NaN$/;

/**
 * A cell a spreadsheet would run as a formula (=, +, -, @, tab, CR first) gets a
 * leading apostrophe; numbers, negative ones included, stay numbers.
 * OWASP's advice for CSV injection, common practice.
 */
export function neutraliseCell(value: string): string {
  return FORMULA_START.test(value) && !NUMBER.test(value) ? `'${value}` : value;
}

/** CSV with a header row, LF line ends, every cell neutralised. */
export function toCsv(fields: string[], rows: (string | number | boolean | null | undefined)[][]): string {
  const cell = (v: string | number | boolean | null | undefined) => (v === null || v === undefined ? "" : neutraliseCell(String(v)));
  return Papa.unparse({ fields: fields.map(cell), data: rows.map((r) => r.map(cell)) }, { newline: "\n" }) + "\n";
}
