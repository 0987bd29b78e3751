"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { elementBalance, reactionText, termKey } from "@/lib/cases/balance";
import { refreshCaseResults } from "@/components/results/use-case-results";
import { sendJson, settle } from "@/lib/api/client";
import { convertTyped, convertTypedList, joinQuantity, splitQuantity, type Quantity, type TemperatureUnit } from "@/lib/cases/temperature";
import { phaseForSpecies } from "@/lib/cases/phase-choice";
import { fieldErrorsOf } from "@/lib/cases/zod-errors";
import { caseInputSchema, type CaseInputs } from "@/lib/validation/cases";

/** What the builder needs of a pinnable version (PinOptionDto). */
export type BuilderOption = {
  versionId: number;
  formula: string;
  speciesName: string;
  modelName: string;
  versionNumber: number;
  status: string;
  phases: string[];
  tminK: number;
  tmaxK: number;
  warning: string | null;
};

export type BuilderInitial = { id: number; lockVersion: number; title: string; notes: string; inputs: CaseInputs };

/** One term of the reaction as typed. */
export type TermRow = { side: "reactant" | "product"; amount: string; formula: string; phase: string; versionId: string };

/** Every typed field of the form but the terms, as the inputs hold them (strings, units beside). */
export type BuilderFields = {
  title: string;
  notes: string;
  mode: "span" | "list";
  unit: TemperatureUnit;
  from: string;
  to: string;
  step: string;
  listText: string;
  refUnit: TemperatureUnit;
  ref: string;
  tol: string;
  kFactor: string;
};

/** Which errors a field's edit clears (with the banner); notes and the span/list switch clear none. */
const CLEARS: Partial<Record<keyof BuilderFields, string>> = {
  title: "title",
  from: "temperatures",
  to: "temperatures",
  step: "temperatures",
  listText: "temperatures",
  ref: "referenceK",
  tol: "toleranceKJ",
  kFactor: "toleranceKFactor",
};

const EMPTY_TERM = (side: TermRow["side"]): TermRow => ({ side, amount: "1", formula: "", phase: "", versionId: "" });

function firstApproved(options: BuilderOption[], formula: string, phase: string): string {
  const fits = options.filter((o) => o.formula === formula && (!phase || o.phases.includes(phase)));
  return String((fits.find((o) => o.status === "approved") ?? fits[0])?.versionId ?? "");
}

function rowsOf(inputs: CaseInputs | undefined): TermRow[] {
  if (!inputs) return [EMPTY_TERM("reactant"), EMPTY_TERM("product")];
  return inputs.terms.map((t) => ({
    side: t.coefficient < 0 ? "reactant" : "product",
    amount: String(Math.abs(t.coefficient)),
    formula: t.formula,
    phase: t.phase ?? "",
    versionId: String(t.versionId),
  }));
}

function unitOf(q: Quantity | undefined, fallback: TemperatureUnit = "K"): TemperatureUnit {
  return q === undefined ? fallback : (splitQuantity(q)?.unit ?? fallback);
}
const valueOf = (q: Quantity | undefined, fallback = "") => (q === undefined ? fallback : String(splitQuantity(q)?.value ?? q));

function fieldsOf(initial: BuilderInitial | undefined): BuilderFields {
  const inputs = initial?.inputs;
  const span = inputs && "fromK" in inputs.temperatures ? inputs.temperatures : null;
  const list = inputs && "listK" in inputs.temperatures ? inputs.temperatures.listK : null;
  return {
    title: initial?.title ?? "",
    notes: initial?.notes ?? "",
    mode: list ? "list" : "span",
    unit: unitOf(span?.fromK ?? list?.[0]),
    from: valueOf(span?.fromK, "300"),
    to: valueOf(span?.toK, "1000"),
    step: valueOf(span?.stepK, "10"),
    listText: list ? list.map((q) => valueOf(q)).join(", ") : "",
    refUnit: unitOf(inputs?.referenceK),
    ref: valueOf(inputs?.referenceK, "298.15"),
    tol: String(inputs?.toleranceKJ ?? 1),
    kFactor: inputs?.toleranceKFactor ? String(inputs.toleranceKFactor) : "",
  };
}

const num = (s: string) => (s.trim() === "" ? NaN : Number(s));

/**
 * The case builder's state: the typed fields, the terms, field errors and the banner, the live
 * balance and reaction preview, and save (create, or revise with the lock version).
 */
export function useCaseBuilder(options: BuilderOption[], initial?: BuilderInitial) {
  const router = useRouter();
  const [fields, setFields] = useState<BuilderFields>(() => fieldsOf(initial));
  const [rows, setRows] = useState<TermRow[]>(() => rowsOf(initial?.inputs));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const formulas = useMemo(() => {
    const seen = new Map<string, string>();
    for (const o of options) if (!seen.has(o.formula)) seen.set(o.formula, o.speciesName);
    return [...seen].sort((a, b) => a[0].localeCompare(b[0]));
  }, [options]);

  /** Editing a field clears its error (and the banner); the next save checks again. */
  const touch = (...prefixes: string[]) => {
    setErrors((e) => Object.fromEntries(Object.entries(e).filter(([k]) => !prefixes.some((p) => k === p || k.startsWith(`${p}.`)))));
    setBanner(null);
  };

  const setField = <K extends keyof BuilderFields>(name: K, value: BuilderFields[K]) => {
    const clears = CLEARS[name];
    if (clears) touch(clears);
    setFields((f) => ({ ...f, [name]: value }));
  };

  const updateRow = (i: number, patch: Partial<TermRow>) => {
    touch(`terms.${i}`, "terms");
    setRows((rs) =>
      rs.map((r, j) => {
        if (j !== i) return r;
        const next = { ...r, ...patch };
        if (patch.formula !== undefined && patch.phase === undefined) next.phase = phaseForSpecies(options, next.formula, next.phase);
        if (patch.formula !== undefined || patch.phase !== undefined) {
          const current = options.find((o) => String(o.versionId) === next.versionId);
          const fits = current && current.formula === next.formula && (!next.phase || current.phases.includes(next.phase));
          if (!fits) next.versionId = firstApproved(options, next.formula, next.phase);
        }
        return next;
      }),
    );
  };
  const addRow = () => setRows((rs) => [...rs, EMPTY_TERM("product")]);
  const removeRow = (i: number) => {
    touch("terms");
    setRows((rs) => rs.filter((_, j) => j !== i));
  };

  /** A unit switch converts what is typed, so the span stays the same temperatures (a step is a difference). */
  const switchUnit = (next: TemperatureUnit) => {
    touch("temperatures");
    setFields((f) => ({
      ...f,
      from: convertTyped(f.from, f.unit, next),
      to: convertTyped(f.to, f.unit, next),
      step: convertTyped(f.step, f.unit, next, "difference"),
      listText: convertTypedList(f.listText, f.unit, next),
      unit: next,
    }));
  };
  const switchRefUnit = (next: TemperatureUnit) => {
    touch("referenceK");
    setFields((f) => ({ ...f, ref: convertTyped(f.ref, f.refUnit, next), refUnit: next }));
  };

  const signed = rows.map((r) => ({ ...r, coefficient: (r.side === "reactant" ? -1 : 1) * Number(r.amount) }));
  const complete = signed.filter((r) => r.formula && Number.isFinite(r.coefficient) && r.coefficient !== 0);
  // A coefficient that is not a number is named, never silently left out of the balance.
  const unreadable = rows.flatMap((r, i) =>
    r.formula && !(r.amount.trim() !== "" && Number.isFinite(Number(r.amount)) && Number(r.amount) !== 0)
      ? [`term ${i + 1} (${r.formula}): “${r.amount.trim()}” is not a coefficient`]
      : [],
  );
  const balance = complete.length >= 2 ? elementBalance(complete) : null;
  const preview = complete.length >= 2 ? reactionText(complete.map((r) => ({ key: termKey({ formula: r.formula, phase: r.phase || null }), coefficient: r.coefficient }))) : "";

  function payload() {
    const { mode, unit, from, to, step, listText, ref, refUnit, tol, kFactor } = fields;
    const temperatures =
      mode === "span"
        ? { fromK: joinQuantity(num(from), unit), toK: joinQuantity(num(to), unit), stepK: joinQuantity(num(step), unit) }
        : {
            listK: listText
              .split(/[\s,;]+/)
              .filter(Boolean)
              .map((s) => joinQuantity(num(s), unit)),
          };
    return {
      title: fields.title,
      notes: fields.notes,
      terms: signed.map((r) => ({ formula: r.formula, phase: r.phase || null, coefficient: r.coefficient, versionId: Number(r.versionId) })),
      temperatures,
      referenceK: joinQuantity(num(ref), refUnit),
      toleranceKJ: num(tol),
      toleranceKFactor: kFactor.trim() ? num(kFactor) : null,
    };
  }

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBanner(null);
    const body = payload();
    const parsed = caseInputSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(fieldErrorsOf(parsed.error.issues));
      setBanner("Fix the marked fields.");
      return;
    }
    setErrors({});
    setBusy(true);
    const answer = initial
      ? await settle(sendJson<{ case: { id: number } }>("PATCH", `/api/v1/cases/${initial.id}`, { ...parsed.data, lockVersion: initial.lockVersion }))
      : await settle(sendJson<{ case: { id: number } }>("POST", "/api/v1/cases", parsed.data));
    setBusy(false);
    if (!answer.ok) {
      if (answer.error.fields) setErrors(answer.error.fields);
      setBanner(answer.error.fields ? "Fix the marked fields." : answer.error.message);
      return;
    }
    // The case page opened next must not show the edited case's old results first.
    await refreshCaseResults(answer.data.case.id);
    router.push(`/cases/${answer.data.case.id}`);
    router.refresh();
  }

  return {
    editing: Boolean(initial),
    fields,
    setField,
    rows,
    updateRow,
    addRow,
    removeRow,
    formulas,
    balance,
    preview,
    unreadable,
    switchUnit,
    switchRefUnit,
    errors,
    err: (k: string): string | undefined => errors[k],
    banner,
    busy,
    save,
    cancel: () => router.back(),
  };
}

export type CaseBuilderState = ReturnType<typeof useCaseBuilder>;
