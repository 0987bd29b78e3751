/**
 * Measured Cp data from CSV or a spreadsheet paste. Pure and client-safe (papaparse only):
 * the upload page previews with the same rules the server applies before it saves anything.
 */
import Papa from "papaparse";
import { isAboveZeroK, joulesPerMolKFrom, kelvinFrom } from "@/lib/thermo/scales";
import { CP_UNITS, DATASET_MAX_BYTES, DATASET_MAX_ROWS, T_UNITS } from "@/lib/validation/library";

export type TUnit = (typeof T_UNITS)[number];
export type CpUnit = (typeof CP_UNITS)[number];

/** One problem, located by the file's own line number (1 = the first line) and column name. */
export type RowError = { row: number; column?: string; message: string };

export type PreviewRow = { row: number; t: string; cp: string; sigma?: string; tK?: number; cpJ?: number; sigmaJ?: number; error?: string };

export type DatasetParse = {
  /** SI points (tK, cpJ, sigmaJ), only when there is no error at all. */
  points: { tK: number; cpJ: number; sigmaJ?: number }[];
  rows: PreviewRow[];
  errors: RowError[];
  tUnit: TUnit;
  cpUnit: CpUnit;
  /** Where the units came from. */
  unitSource: { t: "header" | "chosen" | "default"; cp: "header" | "chosen" | "default" };
  columns: { t: string; cp: string; sigma?: string };
  hasSigma: boolean;
};

export type ParseOptions = { tUnit?: TUnit | ""; cpUnit?: CpUnit | ""; maxRows?: number };

/** Conversions and the calorie come from lib/thermo/scales.ts, the one source. */
export function toKelvin(value: number, unit: TUnit): number {
  return kelvinFrom(value, unit);
}

export function toJPerMolK(value: number, unit: CpUnit): number {
  return joulesPerMolKFrom(value, unit);
}

const T_NAME = /^\s*(t|temp|temperature)\b/i;
const CP_NAME = /^\s*(cp|c_p|heat[ _-]?capacity)\b/i;
const SIGMA_NAME = /^\s*(σ|sigma|u|unc|uncertainty|sd|std|err|error)\b/i;

/** A unit written in a header cell: `T (K)`, `T [°C]`, `T/degF`, `Cp (J/mol/K)`, `Cp, cal/(mol K)`. */
export function headerTUnit(cell: string): TUnit | null {
  const m = /[([/,_ ]\s*(°?\s*[CFK]|deg\s*[CF]|kelvin|celsius|fahrenheit)\s*[)\]]?\s*$/i.exec(cell.trim());
  if (!m) return null;
  const u = m[1].replace(/[°\s]|deg/gi, "").toLowerCase();
  if (u === "k" || u === "kelvin") return "K";
  if (u === "c" || u === "celsius") return "degC";
  if (u === "f" || u === "fahrenheit") return "degF";
  return null;
}

export function headerCpUnit(cell: string): CpUnit | null {
  const lower = cell.toLowerCase();
  if (!/mol/.test(lower)) return null;
  if (/\bkj\b|kj\s*\/|kj\s*mol/.test(lower)) return "kJ/(mol*K)";
  if (/kcal/.test(lower)) return null;
  if (/\bcal\b|cal\s*\/|cal\s*mol/.test(lower)) return "cal/(mol*K)";
  if (/\bj\b|j\s*\/|j\s*mol/.test(lower)) return "J/(mol*K)";
  return null;
}

const isNumberCell = (s: string) => /^\s*[-+]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?\s*$/.test(s);
/** A cell as quoted back in a message: long cells are cut, so one bad cell cannot make a megabyte message. */
const shown = (s: string) => {
  const t = s.trim();
  return t.length > 24 ? `${t.slice(0, 20)}… (${t.length} characters)` : t;
};

/** A decimal comma is accepted when the delimiter is not a comma (European spreadsheets). */
const toNumber = (s: string) => Number(s.trim().replace(",", "."));

/** Tab for a spreadsheet paste, semicolon for European CSV, else comma; decided on the first data lines. */
export function guessDelimiter(text: string): string {
  const sample = text
    .split(/\r?\n/)
    .filter((l) => l.trim() && !l.trim().startsWith("#"))
    .slice(0, 5)
    .join("\n");
  if (sample.includes("\t")) return "\t";
  if (sample.includes(";") && !sample.includes(",")) return ";";
  if (sample.includes(";") && /\d,\d/.test(sample) && sample.split(";").length > sample.split(",").length / 2) return ";";
  return ",";
}

/** Split text into rows with papaparse (quoted fields, CRLF), keeping blank lines so row numbers match the file. */
export function csvRows(text: string, delimiter = guessDelimiter(text)): string[][] {
  return Papa.parse<string[]>(text, { delimiter, skipEmptyLines: false }).data;
}

/** Refusals about the whole file, before its rows are read. */
export function fileProblems(text: string, byteLength: number): RowError[] {
  if (byteLength > DATASET_MAX_BYTES) {
    return [{ row: 0, message: `The file is ${(byteLength / 1048576).toFixed(2)} MB; at most 1 MB is accepted.` }];
  }
  const bad = text.indexOf("\uFFFD");
  if (bad >= 0) {
    const row = text.slice(0, bad).split("\n").length;
    return [{ row, message: `The file is not UTF-8 text: row ${row} holds a character that could not be decoded. Save it as CSV UTF-8 and try again.` }];
  }
  return [];
}

/**
 * Read T, Cp and optional σ columns. Each bad row is reported with its line number and
 * column; points are returned only when every row is good.
 */
export function readDatasetRows(table: string[][], options: ParseOptions = {}): DatasetParse {
  const maxRows = options.maxRows ?? DATASET_MAX_ROWS;
  const errors: RowError[] = [];
  const rows: PreviewRow[] = [];
  // Line numbers are kept as in the file: blank lines and `#` comments are skipped, not removed.
  const lines = table.map((cells, i) => ({ line: i + 1, cells })).filter(({ cells }) => !(cells.length === 1 && cells[0].trim() === "") && !cells[0]?.trim().startsWith("#"));

  let tCol = 0;
  let cpCol = 1;
  let sigmaCol: number | undefined;
  let names = { t: "T", cp: "Cp", sigma: undefined as string | undefined };
  let headerT: TUnit | null = null;
  let headerCp: CpUnit | null = null;
  let body = lines;
  const first = lines[0];
  if (first && !first.cells.every((c) => isNumberCell(c) || c.trim() === "")) {
    const cells = first.cells.map((c) => c.trim());
    const t = cells.findIndex((c) => T_NAME.test(c));
    const cp = cells.findIndex((c) => CP_NAME.test(c));
    const sigma = cells.findIndex((c, i) => i !== t && i !== cp && SIGMA_NAME.test(c));
    if (t < 0 || cp < 0) {
      errors.push({
        row: first.line,
        message: `Row ${first.line} is a header without ${t < 0 ? "a temperature column (T, Temp or Temperature)" : "a Cp column (Cp or Heat capacity)"}.`,
      });
    } else {
      tCol = t;
      cpCol = cp;
      sigmaCol = sigma >= 0 ? sigma : undefined;
      names = { t: cells[t], cp: cells[cp], sigma: sigma >= 0 ? cells[sigma] : undefined };
      headerT = headerTUnit(cells[t]);
      headerCp = headerCpUnit(cells[cp]);
    }
    body = lines.slice(1);
  } else if (first && first.cells.length >= 3) {
    sigmaCol = 2;
    names.sigma = "σ";
  }

  const tUnit: TUnit = headerT ?? (options.tUnit || "K");
  const cpUnit: CpUnit = headerCp ?? (options.cpUnit || "J/(mol*K)");
  const unitSource = {
    t: headerT ? ("header" as const) : options.tUnit ? ("chosen" as const) : ("default" as const),
    cp: headerCp ? ("header" as const) : options.cpUnit ? ("chosen" as const) : ("default" as const),
  };

  if (body.length > maxRows) {
    errors.push({ row: 0, message: `The file has ${body.length} data rows; at most ${maxRows} are accepted.` });
    return { points: [], rows, errors, tUnit, cpUnit, unitSource, columns: names, hasSigma: sigmaCol !== undefined };
  }
  if (errors.length === 0 && body.length === 0) errors.push({ row: 0, message: "The file holds no data rows." });

  const width = first?.cells.length ?? 2;
  const points: DatasetParse["points"] = [];
  for (const { line, cells } of body) {
    const t = cells[tCol] ?? "";
    const cp = cells[cpCol] ?? "";
    const sigma = sigmaCol !== undefined ? (cells[sigmaCol] ?? "") : undefined;
    const row: PreviewRow = { row: line, t, cp, sigma };
    const fail = (column: string | undefined, message: string) => {
      errors.push({ row: line, column, message });
      row.error ??= message;
    };
    if (cells.length < Math.max(tCol, cpCol) + 1) {
      fail(undefined, `Row ${line}: expected ${width} columns, found ${cells.length}.`);
    } else {
      if (!isNumberCell(t)) fail(names.t, `Row ${line}, column "${names.t}": "${shown(t)}" is not a number.`);
      if (!isNumberCell(cp)) fail(names.cp, `Row ${line}, column "${names.cp}": "${shown(cp)}" is not a number.`);
      if (!row.error) {
        row.tK = toKelvin(toNumber(t), tUnit);
        row.cpJ = toJPerMolK(toNumber(cp), cpUnit);
        // A cell of hundreds of digits reads as Infinity, which no fit can use (and JSON stores as null).
        if (!Number.isFinite(row.tK)) fail(names.t, `Row ${line}, column "${names.t}": "${shown(t)}" is too large to be a temperature.`);
        else if (!isAboveZeroK(row.tK)) fail(names.t, `Row ${line}, column "${names.t}": ${t.trim()} ${tUnit === "K" ? "K" : tUnit === "degC" ? "°C" : "°F"} is at or below 0 K.`);
        if (!Number.isFinite(row.cpJ)) fail(names.cp, `Row ${line}, column "${names.cp}": "${shown(cp)}" is too large to be a heat capacity.`);
        else if (!(row.cpJ > 0)) fail(names.cp, `Row ${line}, column "${names.cp}": a heat capacity must be positive (got ${shown(cp)}).`);
      }
      if (sigma !== undefined && sigma.trim() !== "") {
        if (!isNumberCell(sigma)) fail(names.sigma, `Row ${line}, column "${names.sigma}": "${shown(sigma)}" is not a number.`);
        else {
          row.sigmaJ = toJPerMolK(toNumber(sigma), cpUnit);
          if (!Number.isFinite(row.sigmaJ)) fail(names.sigma, `Row ${line}, column "${names.sigma}": "${shown(sigma)}" is too large to be an uncertainty.`);
          else if (!(row.sigmaJ > 0)) fail(names.sigma, `Row ${line}, column "${names.sigma}": an uncertainty must be positive (got ${sigma.trim()}).`);
        }
      }
    }
    rows.push(row);
    if (!row.error) points.push(row.sigmaJ !== undefined ? { tK: row.tK!, cpJ: row.cpJ!, sigmaJ: row.sigmaJ } : { tK: row.tK!, cpJ: row.cpJ! });
  }
  return {
    points: errors.length ? [] : points,
    rows,
    errors,
    tUnit,
    cpUnit,
    unitSource,
    columns: names,
    hasSigma: sigmaCol !== undefined,
  };
}

/** The whole check, as the server runs it. */
export function parseDatasetCsv(text: string, options: ParseOptions = {}, byteLength = new TextEncoder().encode(text).length): DatasetParse {
  const problems = fileProblems(text, byteLength);
  if (problems.length) {
    return {
      points: [],
      rows: [],
      errors: problems,
      tUnit: options.tUnit || "K",
      cpUnit: options.cpUnit || "J/(mol*K)",
      unitSource: { t: "default", cp: "default" },
      columns: { t: "T", cp: "Cp" },
      hasSigma: false,
    };
  }
  return readDatasetRows(csvRows(text.replace(/^\uFEFF/, "")), options);
}
