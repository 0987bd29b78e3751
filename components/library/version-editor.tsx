"use client";

import { useRouter } from "next/navigation";
import { useEffect, useMemo, useState } from "react";
import useSWR from "swr";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { sendJson, settle, type ApiError } from "@/lib/api/client";
import type { SpeciesInput } from "@/lib/thermo/schema";
import { CP_FORMS, type CpForm } from "@/lib/thermo/schema";
import { versionInputSchema } from "@/lib/validation/library";
import { FORM_SPECS, splitRow } from "./cp-forms";
import { defaultPhase, PhaseSelect } from "./phase-select";
import type { CurveLike } from "./curve-rows";
import { PropertyCharts } from "./property-charts";

type SegmentState = { phase: string; form: CpForm; tminK: string; tmaxK: string; values: Record<string, string> };
type RefState = { on: boolean; tK: string; phase: string; hkJ: string; sJ: string };
type Existing = { id: number; lockVersion: number; data: SpeciesInput; citation: string; changeNote: string | null };
type SpeciesOption = { id: number; formula: string; displayName: string; phases?: string[] };

/** A new entry starts in `phase` (the species' one phase, or "" for the author to choose), never a silent "cr". */
function toState(data: SpeciesInput | undefined, phase = ""): { segments: SegmentState[]; reference: RefState; pressure: string } {
  const segments = (data?.segments ?? []).map((s) => ({
    phase: s.phase,
    form: s.form as CpForm,
    tminK: String(s.tminK),
    tmaxK: String(s.tmaxK),
    values: FORM_SPECS[s.form as CpForm].fromCoeffs(s.coeffs),
  }));
  const r = data?.reference;
  return {
    segments: segments.length ? segments : [{ phase, form: "constant", tminK: "298.15", tmaxK: "1000", values: { cpJ: "" } }],
    reference: r ? { on: true, tK: String(r.tK), phase: r.phase, hkJ: String(r.hkJ), sJ: String(r.sJ) } : { on: false, tK: "298.15", phase, hkJ: "", sJ: "" },
    pressure: String(data?.standardPressurePa ?? 100000),
  };
}

const num = (s: string) => (s.trim() === "" ? Number.NaN : Number(s));

function toData(segments: SegmentState[], reference: RefState, pressure: string, transitions: SpeciesInput["transitions"]): SpeciesInput {
  return {
    segments: segments.map(
      (s) => ({ phase: s.phase, form: s.form, tminK: num(s.tminK), tmaxK: num(s.tmaxK), coeffs: FORM_SPECS[s.form].toCoeffs(s.values) }) as SpeciesInput["segments"][number],
    ),
    ...(transitions?.length ? { transitions } : {}),
    ...(reference.on ? { reference: { tK: num(reference.tK), phase: reference.phase, hkJ: num(reference.hkJ), sJ: num(reference.sJ) } } : {}),
    standardPressurePa: Number(pressure),
  };
}

type PreviewAnswer = CurveLike & { warnings: { code: string; message: string }[] };
/** The preview is a computation on a body, not a resource: its key is the URL with the body it is asked for. */
const previewFetcher = ([url, body]: [string, string]) => sendJson<PreviewAnswer>("POST", url, JSON.parse(body));

function FieldError({ error }: { error?: string }) {
  return error ? (
    <p role="alert" className="mt-1 text-xs font-medium text-flag-700">
      {error}
    </p>
  ) : null;
}

/**
 * The model editor: one card per segment with the fields of its Cp form, inline errors from
 * the same zod schema the API uses, and a live curve from the preview API while typing.
 */
export function VersionEditor({ existing, species, modelId }: { existing?: Existing; species?: SpeciesOption[]; modelId?: number }) {
  const router = useRouter();
  const phasesOf = (id: string) => species?.find((x) => String(x.id) === id)?.phases ?? [];
  const firstSpecies = species?.[0] ? String(species[0].id) : "new";
  const initial = useMemo(() => toState(existing?.data, defaultPhase(phasesOf(firstSpecies))), [existing]); // eslint-disable-line react-hooks/exhaustive-deps
  const [segments, setSegments] = useState<SegmentState[]>(initial.segments);
  const [reference, setReference] = useState<RefState>(initial.reference);
  const [pressure, setPressure] = useState(initial.pressure);
  const [citation, setCitation] = useState(existing?.citation ?? "");
  const [changeNote, setChangeNote] = useState(existing?.changeNote ?? "");
  const [lockVersion, setLockVersion] = useState(existing?.lockVersion ?? 0);
  const [speciesId, setSpeciesId] = useState<string>(firstSpecies);
  const known = existing || modelId ? [...new Set(segments.map((x) => x.phase).filter(Boolean))] : speciesId === "new" ? [] : phasesOf(speciesId);
  /** Another species: phases still on the old default follow the new one. */
  const changeSpecies = (id: string) => {
    const was = defaultPhase(phasesOf(speciesId));
    const now = defaultPhase(id === "new" ? [] : phasesOf(id));
    setSpeciesId(id);
    setSegments((all) => all.map((x) => (x.phase === was ? { ...x, phase: now } : x)));
    setReference((r) => (r.phase === was ? { ...r, phase: now } : r));
  };
  const [newFormula, setNewFormula] = useState("");
  const [newName, setNewName] = useState("");
  const [modelName, setModelName] = useState("");
  const [saving, setSaving] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [conflict, setConflict] = useState<Existing | null>(null);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const transitions = existing?.data.transitions;

  const data = useMemo(() => toData(segments, reference, pressure, transitions), [segments, reference, pressure, transitions]);
  const check = versionInputSchema.safeParse({ data, citation: citation || "x", changeNote });
  const errors: Record<string, string> = { ...serverErrors };
  if (!check.success) for (const issue of check.error.issues) errors[issue.path.join(".")] ??= issue.message;
  const err = (path: string) => errors[path];
  const segErr = (i: number, name?: string) =>
    name
      ? (err(`data.segments.${i}.coeffs.${name}`) ?? err(`data.segments.${i}.coeffs.${FORM_SPECS[segments[i].form].fields?.findIndex((f) => f.name === name)}`))
      : err(`data.segments.${i}.coeffs`);

  // Debounced preview: ask the API once typing pauses and the entry is valid.
  const [debounced, setDebounced] = useState<string | null>(null);
  const body = check.success ? JSON.stringify({ data, points: 121 }) : null;
  useEffect(() => {
    const t = setTimeout(() => setDebounced(body), 400);
    return () => clearTimeout(t);
  }, [body]);
  const preview = useSWR<PreviewAnswer, ApiError, [string, string] | null>(debounced ? ["/api/v1/preview", debounced] : null, previewFetcher, {
    keepPreviousData: true,
    revalidateOnFocus: false,
  });

  const update = (i: number, patch: Partial<SegmentState>) => setSegments((all) => all.map((s, j) => (j === i ? { ...s, ...patch } : s)));
  const paste = (i: number, text: string) => {
    const spec = FORM_SPECS[segments[i].form];
    if (!spec.fields) return;
    const cells = splitRow(text);
    update(i, { values: Object.fromEntries(spec.fields.map((f, k) => [f.name, cells[k] ?? ""])) });
  };

  async function save() {
    setSaving(true);
    setMessage(null);
    setServerErrors({});
    const version = { data, citation, changeNote: changeNote || null };
    type Saved = { version: { id: number; lockVersion: number } };
    const answer = await settle(
      existing
        ? sendJson<Saved>("PATCH", `/api/v1/versions/${existing.id}`, { ...version, lockVersion })
        : modelId
          ? sendJson<Saved>("POST", `/api/v1/models/${modelId}/versions`, version)
          : sendJson<Saved>("POST", "/api/v1/models", {
              ...(speciesId === "new" ? { species: { formula: newFormula, displayName: newName } } : { speciesId: Number(speciesId) }),
              name: modelName,
              version,
            }),
    );
    setSaving(false);
    if (!answer.ok) {
      const e = answer.error;
      const current = e.details?.current as Existing | undefined;
      if (e.status === 409 && current) {
        setConflict(current);
        setMessage(e.message);
        return;
      }
      if (e.fields) setServerErrors(Object.fromEntries(Object.entries(e.fields).map(([k, v]) => [k.replace(/^version\./, ""), v])));
      setMessage(e.message);
      return;
    }
    const v = answer.data.version;
    setLockVersion(v.lockVersion);
    router.push(`/library/versions/${v.id}`);
    router.refresh();
  }

  function loadTheirs() {
    if (!conflict) return;
    const s = toState(conflict.data);
    setSegments(s.segments);
    setReference(s.reference);
    setPressure(s.pressure);
    setCitation(conflict.citation);
    setChangeNote(conflict.changeNote ?? "");
    setLockVersion(conflict.lockVersion);
    setConflict(null);
    setMessage("Loaded the saved version; make your change again and save.");
  }

  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,28rem)]">
      <form
        className="space-y-5"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          void save();
        }}
      >
        {!existing && !modelId && (
          <section className="space-y-3 rounded-lg border border-ink-line bg-white p-4 shadow-card">
            <h2 className="text-sm font-semibold">Species and model</h2>
            <div className="grid gap-3 sm:grid-cols-2">
              <label className="space-y-1 text-sm text-ink-soft">
                <span className="font-medium">Species</span>
                <select className={inputClass} value={speciesId} onChange={(e) => changeSpecies(e.target.value)} aria-label="Species">
                  {species?.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.formula} · {s.displayName}
                    </option>
                  ))}
                  <option value="new">New species…</option>
                </select>
              </label>
              <label className="space-y-1 text-sm text-ink-soft">
                <span className="font-medium">Model name</span>
                <input
                  className={inputClass}
                  value={modelName}
                  onChange={(e) => setModelName(e.target.value)}
                  placeholder="e.g. Support lot 8 · Maier–Kelley"
                  aria-invalid={!!err("name")}
                />
                <FieldError error={err("name")} />
              </label>
              {speciesId === "new" && (
                <>
                  <label className="space-y-1 text-sm text-ink-soft">
                    <span className="font-medium">Formula</span>
                    <input className={inputClass} value={newFormula} onChange={(e) => setNewFormula(e.target.value)} placeholder="NiAl2O4" />
                    <FieldError error={err("species.formula")} />
                  </label>
                  <label className="space-y-1 text-sm text-ink-soft">
                    <span className="font-medium">Display name</span>
                    <input className={inputClass} value={newName} onChange={(e) => setNewName(e.target.value)} />
                    <FieldError error={err("species.displayName")} />
                  </label>
                </>
              )}
            </div>
          </section>
        )}

        {segments.map((s, i) => {
          const spec = FORM_SPECS[s.form];
          return (
            <section key={i} className="space-y-3 rounded-lg border border-ink-line bg-white p-4 shadow-card" data-testid="segment-editor">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <h2 className="text-sm font-semibold">Segment {i + 1}</h2>
                {segments.length > 1 && (
                  <Button type="button" variant="ghost" onClick={() => setSegments((all) => all.filter((_, j) => j !== i))}>
                    Remove
                  </Button>
                )}
              </div>
              <div className="grid gap-3 sm:grid-cols-4">
                <label className="space-y-1 text-sm text-ink-soft">
                  <span className="font-medium">Phase</span>
                  <PhaseSelect
                    value={s.phase}
                    onChange={(p) => {
                      update(i, { phase: p });
                      // The anchor usually sits in the first segment's phase: it follows it unless set apart.
                      if (i === 0 && (!reference.phase || reference.phase === s.phase)) setReference({ ...reference, phase: p });
                    }}
                    known={known}
                    label={`Segment ${i + 1} phase`}
                    invalid={!s.phase}
                  />
                  <FieldError error={s.phase ? err(`data.segments.${i}.phase`) : "Choose a phase."} />
                </label>
                <label className="space-y-1 text-sm text-ink-soft">
                  <span className="font-medium">Cp form</span>
                  <select className={inputClass} value={s.form} onChange={(e) => update(i, { form: e.target.value as CpForm, values: {} })} aria-label={`Segment ${i + 1} form`}>
                    {CP_FORMS.map((f) => (
                      <option key={f} value={f}>
                        {FORM_SPECS[f].label}
                      </option>
                    ))}
                  </select>
                </label>
                <label className="space-y-1 text-sm text-ink-soft">
                  <span className="font-medium">From (K)</span>
                  <input
                    className={inputClass}
                    inputMode="decimal"
                    value={s.tminK}
                    onChange={(e) => update(i, { tminK: e.target.value })}
                    aria-label={`Segment ${i + 1} from (K)`}
                  />
                  <FieldError error={err(`data.segments.${i}.tminK`)} />
                </label>
                <label className="space-y-1 text-sm text-ink-soft">
                  <span className="font-medium">To (K)</span>
                  <input className={inputClass} inputMode="decimal" value={s.tmaxK} onChange={(e) => update(i, { tmaxK: e.target.value })} aria-label={`Segment ${i + 1} to (K)`} />
                  <FieldError error={err(`data.segments.${i}.tmaxK`)} />
                </label>
              </div>
              <p className="text-xs text-ink-muted">{spec.hint}</p>
              {spec.fields && (
                <>
                  <label className="block space-y-1 text-sm text-ink-soft">
                    <span className="font-medium">Paste a row from a spreadsheet</span>
                    <input
                      className={inputClass}
                      placeholder={spec.fields.map((f) => f.name).join("  ")}
                      onChange={(e) => paste(i, e.target.value)}
                      aria-label={`Segment ${i + 1} paste row`}
                    />
                  </label>
                  <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
                    {spec.fields.map((f) => (
                      <label key={f.name} className="space-y-1 text-sm text-ink-soft">
                        <span className="font-medium">
                          {f.name} <span className="font-normal text-ink-muted">{f.unit}</span>
                        </span>
                        <input
                          className={`${inputClass} font-mono`}
                          inputMode="decimal"
                          value={s.values[f.name] ?? ""}
                          onChange={(e) => update(i, { values: { ...s.values, [f.name]: e.target.value } })}
                          aria-label={`Segment ${i + 1} ${f.name}`}
                          aria-invalid={!!segErr(i, f.name)}
                        />
                        <FieldError error={segErr(i, f.name)} />
                      </label>
                    ))}
                  </div>
                  <FieldError error={segErr(i)} />
                </>
              )}
              {spec.text && (
                <label className="block space-y-1 text-sm text-ink-soft">
                  <span className="font-medium">{spec.text.label}</span>
                  {spec.text.name === "cp" ? (
                    <input
                      className={`${inputClass} font-mono`}
                      value={s.values.cp ?? ""}
                      placeholder={spec.text.placeholder}
                      onChange={(e) => update(i, { values: { cp: e.target.value } })}
                      aria-label={`Segment ${i + 1} expression`}
                    />
                  ) : (
                    <textarea
                      rows={4}
                      className={`${inputClass} font-mono`}
                      value={s.values[spec.text.name] ?? ""}
                      placeholder={spec.text.placeholder}
                      onChange={(e) => update(i, { values: { [spec.text!.name]: e.target.value } })}
                      aria-label={`Segment ${i + 1} ${spec.text.name}`}
                    />
                  )}
                  <FieldError error={Object.entries(errors).find(([k]) => k.startsWith(`data.segments.${i}.coeffs`))?.[1]} />
                </label>
              )}
            </section>
          );
        })}
        <Button
          type="button"
          variant="secondary"
          onClick={() => setSegments((all) => [...all, { ...all[all.length - 1], tminK: all[all.length - 1].tmaxK, tmaxK: "", values: { ...all[all.length - 1].values } }])}
        >
          Add a segment
        </Button>

        <section className="space-y-3 rounded-lg border border-ink-line bg-white p-4 shadow-card">
          <label className="flex items-center gap-2 text-sm font-semibold">
            <input type="checkbox" checked={reference.on} onChange={(e) => setReference({ ...reference, on: e.target.checked })} /> Anchor (H and S at one temperature)
          </label>
          <p className="text-xs text-ink-muted">Needed by forms without their own integration constants (constant, Maier–Kelley, power, table, expression).</p>
          {reference.on && (
            <div className="grid gap-3 sm:grid-cols-4">
              <label className="space-y-1 text-sm text-ink-soft">
                <span className="font-medium">T (K)</span>
                <input className={inputClass} value={reference.tK} onChange={(e) => setReference({ ...reference, tK: e.target.value })} aria-label="Anchor T (K)" />
                <FieldError error={err("data.reference.tK")} />
              </label>
              <label className="space-y-1 text-sm text-ink-soft">
                <span className="font-medium">Phase</span>
                <PhaseSelect value={reference.phase} onChange={(p) => setReference({ ...reference, phase: p })} known={known} label="Anchor phase" invalid={!reference.phase} />
                <FieldError error={reference.phase ? err("data.reference.phase") : "Choose the anchor's phase."} />
              </label>
              <label className="space-y-1 text-sm text-ink-soft">
                <span className="font-medium">
                  H <span className="font-normal text-ink-muted">kJ/mol</span>
                </span>
                <input className={inputClass} value={reference.hkJ} onChange={(e) => setReference({ ...reference, hkJ: e.target.value })} aria-label="Anchor H (kJ/mol)" />
                <FieldError error={err("data.reference.hkJ")} />
              </label>
              <label className="space-y-1 text-sm text-ink-soft">
                <span className="font-medium">
                  S <span className="font-normal text-ink-muted">J/(mol·K)</span>
                </span>
                <input className={inputClass} value={reference.sJ} onChange={(e) => setReference({ ...reference, sJ: e.target.value })} aria-label="Anchor S (J/(mol·K))" />
                <FieldError error={err("data.reference.sJ")} />
              </label>
            </div>
          )}
          <label className="block space-y-1 text-sm text-ink-soft">
            <span className="font-medium">Standard pressure of the source</span>
            <select className={inputClass} value={pressure} onChange={(e) => setPressure(e.target.value)}>
              <option value="100000">1 bar (100 000 Pa)</option>
              <option value="101325">1 atm (101 325 Pa), converted for gases</option>
            </select>
          </label>
        </section>

        <section className="space-y-3 rounded-lg border border-ink-line bg-white p-4 shadow-card">
          <label className="block space-y-1 text-sm text-ink-soft">
            <span className="font-medium">Citation</span>
            <textarea
              rows={2}
              className={inputClass}
              value={citation}
              onChange={(e) => setCitation(e.target.value)}
              aria-label="Citation"
              placeholder="Where the numbers come from"
            />
            <FieldError error={citation.trim() ? err("citation") : "Enter a citation (where the numbers come from)."} />
          </label>
          <label className="block space-y-1 text-sm text-ink-soft">
            <span className="font-medium">Change note</span>
            <textarea rows={2} className={inputClass} value={changeNote} onChange={(e) => setChangeNote(e.target.value)} aria-label="Change note" />
          </label>
        </section>

        {message && (
          <p role="alert" className="text-sm text-flag-700">
            {message}
          </p>
        )}
        {conflict && (
          <Button type="button" variant="secondary" onClick={loadTheirs}>
            Load the saved version
          </Button>
        )}
        <div className="flex gap-2">
          <Button type="submit" disabled={saving || !check.success || !citation.trim()}>
            {saving ? "Saving…" : existing ? "Save draft" : "Create draft"}
          </Button>
        </div>
      </form>

      <aside className="space-y-3 xl:sticky xl:top-4 xl:self-start" aria-label="Live preview" data-testid="editor-preview">
        <div className="rounded-lg border border-ink-line bg-white p-4 shadow-card">
          <h2 className="mb-2 flex items-center justify-between text-sm font-semibold">
            Live preview{" "}
            {preview.isLoading || preview.isValidating ? (
              <span className="text-xs font-normal text-ink-muted" role="status">
                computing…
              </span>
            ) : null}
          </h2>
          {!check.success && <p className="text-sm text-ink-muted">Complete the highlighted fields to see the curve.</p>}
          {preview.error && (
            <p role="alert" className="text-sm text-flag-700">
              {preview.error.message}
            </p>
          )}
          {preview.data && !preview.error && <PropertyCharts a={preview.data} labelA="this draft" stacked />}
          {preview.data?.warnings?.length ? (
            <ul className="mt-2 space-y-1 text-xs text-ember-700">
              {preview.data.warnings.slice(0, 4).map((w, k) => (
                <li key={k}>{w.message}</li>
              ))}
            </ul>
          ) : null}
        </div>
      </aside>
    </div>
  );
}
