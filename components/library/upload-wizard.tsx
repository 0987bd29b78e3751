"use client";

import Papa from "papaparse";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { PointsChart } from "@/components/charts/residual-chart";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { DataTable } from "@/components/ui/table";
import { defaultPhase, PhaseSelect } from "./phase-select";
import { sendJson, settle } from "@/lib/api/client";
import { fileProblems, guessDelimiter, readDatasetRows, type DatasetParse } from "@/lib/datasets/csv";
import { CP_UNIT_LABELS, CP_UNITS, DATASET_MAX_BYTES, T_UNIT_LABELS, T_UNITS } from "@/lib/validation/library";

type SpeciesOption = { id: number; formula: string; displayName: string; phases?: string[] };
type Dataset = { id: number; name: string; pointCount: number; rangeK: [number, number] | null; sha256: string; phase?: string | null };
type Fit = {
  form: string;
  coefficients: Record<string, number>;
  integrationConstants?: Record<string, number>;
  rmsJ: number;
  maxAbsJ: number;
  r2: number;
  conditionNumber: number;
  points: number;
  tminK: number;
  tmaxK: number;
  residuals: { tK: number; cpJ: number; fittedJ: number; residualJ: number }[];
  data: unknown | null;
};

const FIT_FORMS = [
  ["maier-kelley", "Maier–Kelley: a + bT + c/T²"],
  ["shomate", "Shomate (t = T/1000)"],
  ["nasa7", "NASA 7-coefficient"],
  ["power", "Power series (choose exponents)"],
] as const;

/** Parse in chunks so a large file shows progress and the page stays responsive. */
function parseInChunks(text: string, onProgress: (fraction: number) => void): Promise<string[][]> {
  return new Promise((resolve) => {
    const rows: string[][] = [];
    Papa.parse<string[]>(text, {
      delimiter: guessDelimiter(text),
      skipEmptyLines: false,
      chunkSize: 64 * 1024,
      chunk: (result: Papa.ParseResult<string[]>) => {
        rows.push(...result.data);
        onProgress(Math.min(1, result.meta.cursor / Math.max(1, text.length)));
      },
      complete: () => resolve(rows),
    });
  });
}

const post = <T,>(url: string, body: unknown) => settle(sendJson<T>("POST", url, body));

export function UploadWizard({ species }: { species: SpeciesOption[] }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [speciesId, setSpeciesId] = useState(species[0] ? String(species[0].id) : "new");
  const knownPhases = (id: string) => species.find((s) => String(s.id) === id)?.phases ?? [];
  // The phase measured: the species' one phase when it has exactly one, else the uploader says.
  const [measuredPhase, setMeasuredPhase] = useState(() => defaultPhase(knownPhases(speciesId)));
  const [measuredTouched, setMeasuredTouched] = useState(false);
  const [formula, setFormula] = useState("");
  const [displayName, setDisplayName] = useState("");
  const [tUnit, setTUnit] = useState<"" | (typeof T_UNITS)[number]>("");
  const [cpUnit, setCpUnit] = useState<"" | (typeof CP_UNITS)[number]>("");
  const [text, setText] = useState("");
  const [filename, setFilename] = useState<string | null>(null);
  const [parse, setParse] = useState<DatasetParse | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [dataset, setDataset] = useState<Dataset | null>(null);
  const [form, setForm] = useState<string>("maier-kelley");
  const [exponents, setExponents] = useState("0 1 -2");
  const [phase, setPhase] = useState("");
  const [tmin, setTmin] = useState("");
  const [tmax, setTmax] = useState("");
  const [refT, setRefT] = useState("298.15");
  const [refH, setRefH] = useState("");
  const [refS, setRefS] = useState("");
  const [fit, setFit] = useState<Fit | null>(null);
  const [modelName, setModelName] = useState("");
  const [citation, setCitation] = useState("");

  async function preview(raw: string, units = { tUnit, cpUnit }) {
    setError(null);
    setParse(null);
    setProgress(0);
    const problems = fileProblems(raw, new TextEncoder().encode(raw).length);
    const table = problems.length ? [] : await parseInChunks(raw.replace(/^\uFEFF/, ""), setProgress);
    setProgress(null);
    setParse(
      problems.length
        ? { points: [], rows: [], errors: problems, tUnit: "K", cpUnit: "J/(mol*K)", unitSource: { t: "default", cp: "default" }, columns: { t: "T", cp: "Cp" }, hasSigma: false }
        : readDatasetRows(table, units),
    );
  }

  async function onFile(file: File | undefined) {
    if (!file) return;
    setFilename(file.name);
    if (!name) setName(file.name.replace(/\.[^.]+$/, ""));
    if (file.size > DATASET_MAX_BYTES) {
      setParse(null);
      return setError(`The file is ${(file.size / 1048576).toFixed(2)} MB; at most 1 MB is accepted.`);
    }
    let decoded: string;
    try {
      decoded = new TextDecoder("utf-8", { fatal: true }).decode(await file.arrayBuffer());
    } catch {
      setParse(null);
      return setError("The file is not UTF-8 text. Save it as CSV UTF-8 and try again.");
    }
    setText(decoded);
    await preview(decoded);
  }

  async function upload() {
    setBusy("upload");
    setError(null);
    const body = {
      name,
      filename,
      text,
      tUnit,
      cpUnit,
      phase: measuredPhase || null,
      ...(speciesId === "new" ? { species: { formula, displayName } } : { speciesId: Number(speciesId) }),
    };
    const answer = await post<{ dataset: Dataset }>("/api/v1/datasets", body);
    setBusy(null);
    if (!answer.ok) return setError(answer.error.message);
    const data = answer.data;
    setDataset(data.dataset);
    setPhase(defaultPhase(knownPhases(speciesId), data.dataset.phase));
    if (data.dataset.rangeK) {
      setTmin(String(data.dataset.rangeK[0]));
      setTmax(String(data.dataset.rangeK[1]));
    }
    const sp = species.find((s) => String(s.id) === speciesId);
    setModelName(`${sp?.formula ?? formula} · fitted to ${data.dataset.name}`);
  }

  const fitBody = () => ({
    form,
    phase,
    ...(tmin ? { tminK: Number(tmin) } : {}),
    ...(tmax ? { tmaxK: Number(tmax) } : {}),
    ...(form === "power"
      ? {
          exponents: exponents
            .split(/[\s,]+/)
            .filter(Boolean)
            .map(Number),
        }
      : {}),
    ...(refH.trim() && refS.trim() ? { reference: { tK: Number(refT), hkJ: Number(refH), sJ: Number(refS) } } : {}),
  });

  const phaseMissing = "Choose the phase the fit is for: the dataset does not say and the species has no single phase.";
  async function runFit() {
    if (!dataset) return;
    if (!phase) return setError(phaseMissing);
    setBusy("fit");
    setError(null);
    const answer = await post<{ fit: Fit }>(`/api/v1/datasets/${dataset.id}/fit`, fitBody());
    setBusy(null);
    if (!answer.ok) return setError(answer.error.message);
    setFit(answer.data.fit);
  }

  async function saveDraft() {
    if (!dataset) return;
    if (!phase) return setError(phaseMissing);
    setBusy("save");
    setError(null);
    const answer = await post<{ version: { id: number } }>(`/api/v1/datasets/${dataset.id}/versions`, { fit: fitBody(), modelName, citation });
    setBusy(null);
    if (!answer.ok) return setError(answer.error.message);
    router.push(`/library/versions/${answer.data.version.id}`);
  }

  const bad = parse?.errors ?? [];
  const label = "space-y-1 text-sm text-ink-soft";
  return (
    <div className="space-y-6">
      <section className="space-y-4 rounded-lg border border-ink-line bg-white p-4 shadow-card">
        <h2 className="text-sm font-semibold">1 · Measured data</h2>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <label className={label}>
            <span className="font-medium">Dataset name</span>
            <input className={inputClass} value={name} onChange={(e) => setName(e.target.value)} aria-label="Dataset name" />
          </label>
          <label className={label}>
            <span className="font-medium">Species measured</span>
            <select
              className={inputClass}
              value={speciesId}
              onChange={(e) => {
                setSpeciesId(e.target.value);
                if (!measuredTouched) setMeasuredPhase(defaultPhase(knownPhases(e.target.value)));
              }}
              aria-label="Species measured"
            >
              {species.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.formula} · {s.displayName}
                </option>
              ))}
              <option value="new">New species…</option>
            </select>
          </label>
          <label className={label}>
            <span className="font-medium">Phase measured</span>
            <PhaseSelect
              value={measuredPhase}
              onChange={(p) => {
                setMeasuredPhase(p);
                setMeasuredTouched(true);
              }}
              known={speciesId === "new" ? [] : knownPhases(speciesId)}
              label="Phase measured"
            />
          </label>
          <label className={label}>
            <span className="font-medium">Temperature unit</span>
            <select
              className={inputClass}
              value={tUnit}
              onChange={(e) => {
                const v = e.target.value as typeof tUnit;
                setTUnit(v);
                if (text) void preview(text, { tUnit: v, cpUnit });
              }}
              aria-label="Temperature unit"
            >
              <option value="">From the header (else K)</option>
              {T_UNITS.map((u) => (
                <option key={u} value={u}>
                  {T_UNIT_LABELS[u]}
                </option>
              ))}
            </select>
          </label>
          <label className={label}>
            <span className="font-medium">Cp unit</span>
            <select
              className={inputClass}
              value={cpUnit}
              onChange={(e) => {
                const v = e.target.value as typeof cpUnit;
                setCpUnit(v);
                if (text) void preview(text, { tUnit, cpUnit: v });
              }}
              aria-label="Cp unit"
            >
              <option value="">From the header (else J/(mol·K))</option>
              {CP_UNITS.map((u) => (
                <option key={u} value={u}>
                  {CP_UNIT_LABELS[u]}
                </option>
              ))}
            </select>
          </label>
          {speciesId === "new" && (
            <>
              <label className={label}>
                <span className="font-medium">Formula</span>
                <input className={inputClass} value={formula} onChange={(e) => setFormula(e.target.value)} aria-label="Formula" />
              </label>
              <label className={label}>
                <span className="font-medium">Display name</span>
                <input className={inputClass} value={displayName} onChange={(e) => setDisplayName(e.target.value)} aria-label="Display name" />
              </label>
            </>
          )}
        </div>
        <div className="grid gap-3 lg:grid-cols-2">
          <label className={label}>
            <span className="font-medium">CSV file (UTF-8, at most 1 MB)</span>
            <input
              type="file"
              accept=".csv,.txt,.tsv,text/csv,text/plain"
              onChange={(e) => void onFile(e.target.files?.[0])}
              className="block w-full text-sm"
              aria-label="CSV file"
            />
            <span className="block text-xs text-ink-muted">Columns T and Cp, optional σ; units in the header like “T (°C)”, “Cp (J/mol/K)”.</span>
          </label>
          <label className={label}>
            <span className="font-medium">…or paste from a spreadsheet</span>
            <textarea
              rows={5}
              className={`${inputClass} font-mono text-xs`}
              value={text}
              onChange={(e) => {
                setText(e.target.value);
                setFilename(null);
              }}
              onBlur={() => text && void preview(text)}
              aria-label="Pasted data"
              placeholder={"T (K)\tCp (J/mol/K)\tsigma\n300\t131.6\t0.8"}
            />
          </label>
        </div>
        <div className="flex flex-wrap items-center gap-3">
          <Button type="button" variant="secondary" onClick={() => void preview(text)} disabled={!text}>
            Check the rows
          </Button>
          {progress !== null && (
            <span role="status" className="text-sm text-ink-muted">
              Reading… {Math.round(progress * 100)} %
            </span>
          )}
        </div>
        {parse && (
          <div className="space-y-3" data-testid="csv-preview">
            <p className="text-sm">
              {parse.rows.length} rows · T in {T_UNIT_LABELS[parse.tUnit]} ({parse.unitSource.t}) · Cp in {CP_UNIT_LABELS[parse.cpUnit]} ({parse.unitSource.cp})
              {parse.hasSigma ? " · with σ" : ""}
            </p>
            {bad.length > 0 && (
              <div role="alert" className="rounded-md border border-flag-600/30 bg-flag-50 p-3 text-sm text-flag-700" data-testid="csv-errors">
                <p className="font-medium">
                  {bad.length} problem{bad.length === 1 ? "" : "s"}; nothing will be saved until they are fixed:
                </p>
                <ul className="mt-1 list-disc pl-5">
                  {bad.slice(0, 20).map((e, i) => (
                    <li key={i}>{e.message}</li>
                  ))}
                </ul>
              </div>
            )}
            {parse.rows.length > 0 && (
              <div className="max-h-72 overflow-auto rounded-md border border-ink-line">
                <DataTable
                  look="grid"
                  align="left"
                  nowrapHeader
                  columns={[
                    { key: "row", header: "Row", cell: (r) => r.row },
                    { key: "t", header: parse.columns.t, cell: (r) => r.t },
                    { key: "cp", header: parse.columns.cp, cell: (r) => r.cp },
                    parse.hasSigma && { key: "sigma", header: parse.columns.sigma, cell: (r) => r.sigma },
                    { key: "tk", header: "T (K)", cell: (r) => (r.tK !== undefined ? r.tK.toFixed(2) : "") },
                    { key: "cpj", header: "Cp (J/(mol·K))", cell: (r) => (r.cpJ !== undefined ? r.cpJ.toFixed(3) : "") },
                    { key: "problem", header: "Problem", cell: (r) => r.error ?? "" },
                  ]}
                  rows={parse.rows.slice(0, 200)}
                  rowKey={(r) => r.row}
                  rowClassName={(r) => (r.error ? "bg-flag-50 text-flag-700" : undefined)}
                />
              </div>
            )}
            {!dataset && (
              <Button type="button" onClick={() => void upload()} disabled={!!busy || bad.length > 0 || !name.trim()}>
                {busy === "upload" ? "Uploading…" : "Upload dataset"}
              </Button>
            )}
          </div>
        )}
        {dataset && (
          <p role="status" className="text-sm text-moss-700">
            Saved “{dataset.name}”: {dataset.pointCount} points, {dataset.rangeK?.join("–")} K, SHA-256 {dataset.sha256.slice(0, 12)}…
          </p>
        )}
      </section>

      {dataset && (
        <section className="space-y-4 rounded-lg border border-ink-line bg-white p-4 shadow-card">
          <h2 className="text-sm font-semibold">2 · Fit a Cp form</h2>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            <label className={label}>
              <span className="font-medium">Form</span>
              <select className={inputClass} value={form} onChange={(e) => setForm(e.target.value)} aria-label="Form to fit">
                {FIT_FORMS.map(([v, l]) => (
                  <option key={v} value={v}>
                    {l}
                  </option>
                ))}
              </select>
            </label>
            {form === "power" && (
              <label className={label}>
                <span className="font-medium">Exponents</span>
                <input className={inputClass} value={exponents} onChange={(e) => setExponents(e.target.value)} aria-label="Exponents" />
              </label>
            )}
            <label className={label}>
              <span className="font-medium">Phase</span>
              <PhaseSelect
                value={phase}
                onChange={(p) => {
                  setPhase(p);
                  setError(null);
                }}
                known={speciesId === "new" ? [] : knownPhases(speciesId)}
                label="Phase"
                invalid={!phase}
              />
            </label>
            <label className={label}>
              <span className="font-medium">From (K)</span>
              <input className={inputClass} value={tmin} onChange={(e) => setTmin(e.target.value)} aria-label="Fit from (K)" />
            </label>
            <label className={label}>
              <span className="font-medium">To (K)</span>
              <input className={inputClass} value={tmax} onChange={(e) => setTmax(e.target.value)} aria-label="Fit to (K)" />
            </label>
            <label className={label}>
              <span className="font-medium">Anchor T (K)</span>
              <input className={inputClass} value={refT} onChange={(e) => setRefT(e.target.value)} aria-label="Anchor T (K)" />
            </label>
            <label className={label}>
              <span className="font-medium">
                H at anchor <span className="font-normal text-ink-muted">kJ/mol</span>
              </span>
              <input className={inputClass} value={refH} onChange={(e) => setRefH(e.target.value)} aria-label="Anchor H (kJ/mol)" />
            </label>
            <label className={label}>
              <span className="font-medium">
                S at anchor <span className="font-normal text-ink-muted">J/(mol·K)</span>
              </span>
              <input className={inputClass} value={refS} onChange={(e) => setRefS(e.target.value)} aria-label="Anchor S (J/(mol·K))" />
            </label>
          </div>
          <div className="flex items-center gap-3">
            <Button type="button" onClick={() => void runFit()} disabled={!!busy}>
              {busy === "fit" ? "Fitting…" : "Fit"}
            </Button>
            {busy === "fit" && (
              <span role="status" className="text-sm text-ink-muted">
                Solving the weighted least-squares problem…
              </span>
            )}
          </div>
          {fit && (
            <div className="space-y-4" data-testid="fit-result">
              <dl className="grid grid-cols-2 gap-3 text-sm sm:grid-cols-5">
                <div>
                  <dt className="text-xs text-ink-muted">Points</dt>
                  <dd className="tabular">
                    {fit.points} ({fit.tminK}–{fit.tmaxK} K)
                  </dd>
                </div>
                <div>
                  <dt className="text-xs text-ink-muted">RMS deviation</dt>
                  <dd className="tabular" data-testid="fit-rms">
                    {fit.rmsJ.toPrecision(3)} J/(mol·K)
                  </dd>
                </div>
                <div>
                  <dt className="text-xs text-ink-muted">Max deviation</dt>
                  <dd className="tabular">{fit.maxAbsJ.toPrecision(3)} J/(mol·K)</dd>
                </div>
                <div>
                  <dt className="text-xs text-ink-muted">R²</dt>
                  <dd className="tabular">{fit.r2.toFixed(6)}</dd>
                </div>
                <div>
                  <dt className="text-xs text-ink-muted">Condition number</dt>
                  <dd className="tabular">{fit.conditionNumber.toExponential(2)}</dd>
                </div>
              </dl>
              <p className="break-all font-mono text-xs">
                {Object.entries({ ...fit.coefficients, ...(fit.integrationConstants ?? {}) })
                  .map(([k, v]) => `${k} = ${Number(v.toPrecision(8))}`)
                  .join(",  ")}
              </p>
              <div className="grid gap-6 lg:grid-cols-2">
                <PointsChart
                  points={fit.residuals.map((r) => ({ x: r.tK, y: r.cpJ }))}
                  pointsName="measured"
                  line={fit.residuals.map((r) => ({ x: r.tK, y: r.fittedJ }))}
                  lineName="fitted"
                  xLabel="T (K)"
                  yLabel="Cp (J/(mol·K))"
                  testId="fit-chart"
                  ariaLabel="Measured and fitted heat capacity"
                />
                <PointsChart
                  points={fit.residuals.map((r) => ({ x: r.tK, y: r.residualJ }))}
                  pointsName="measured − fitted"
                  xLabel="T (K)"
                  yLabel="Residual (J/(mol·K))"
                  zeroLine
                  testId="residual-chart"
                  ariaLabel="Residuals of the fit"
                />
              </div>
              {!fit.data && <p className="text-sm text-ember-700">Enter H and S at the anchor to save this fit as a model: Cp alone gives no H or S.</p>}
            </div>
          )}
        </section>
      )}

      {fit && dataset && (
        <section className="space-y-3 rounded-lg border border-ink-line bg-white p-4 shadow-card">
          <h2 className="text-sm font-semibold">3 · Save as a draft</h2>
          <div className="grid gap-3 lg:grid-cols-2">
            <label className={label}>
              <span className="font-medium">Model name</span>
              <input className={inputClass} value={modelName} onChange={(e) => setModelName(e.target.value)} aria-label="Model name" />
            </label>
            <label className={label}>
              <span className="font-medium">Citation</span>
              <input className={inputClass} value={citation} onChange={(e) => setCitation(e.target.value)} aria-label="Citation" placeholder="Lab, instrument, run, date" />
            </label>
          </div>
          <Button type="button" onClick={() => void saveDraft()} disabled={!!busy || !citation.trim() || !fit.data}>
            {busy === "save" ? "Saving…" : "Save as draft"}
          </Button>
        </section>
      )}
      {error && (
        <p role="alert" className="text-sm text-flag-700" data-testid="wizard-error">
          {error}
        </p>
      )}
    </div>
  );
}
