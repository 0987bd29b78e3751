"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import useSWRMutation from "swr/mutation";
import type { CaseResults } from "@/components/results/use-case-results";
import { ApiError, sendJson } from "@/lib/api/client";
import { checkEquilibriumForm, checkReactionLine, checkSpeciesKey } from "@/lib/cases/equilibrium-form";
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import type { CaseEquilibrium, ExtraTerm } from "@/lib/validation/equilibrium";
import type { SourcesDto } from "./source-comparison";

/** Species keys of a reaction text ("2 H2(g) + O2(g) -> 2 H2O(g)" → H2(g), O2(g), H2O(g)). */
export function keysOfReaction(text: string): string[] {
  return text
    .split(/->|=/)
    .flatMap((side) => side.split("+"))
    .map((t) => t.trim().replace(/^(\d+(?:\.\d+)?(?:\/\d+)?|\.\d+)\s*\*?\s*/, ""))
    .filter(Boolean);
}

export const markerless = (key: string) => {
  const m = /^(.*?)(?:\((cr(?:-[A-Za-z0-9_.]+)?|l|g)\))?$/.exec(key)!;
  return { formula: m[1], phase: m[2] ?? null };
};

type Row = { key: string; amount: string };
type Refusal = Pick<ApiError, "message" | "details">;

/**
 * The API's refusal → messages keyed by the panel's field names (`feed.<key>`, `feedUnit`,
 * `pressure`, `key`, `reactions.<i>`), in plain words without field paths; what names no field
 * comes back as `_`.
 */
export function panelErrors(error: Refusal): Record<string, string> {
  const out: Record<string, string> = {};
  const sentence = (m: string) => {
    const t = m.trim();
    return t ? `${t[0].toUpperCase()}${t.slice(1)}${/[.!?]$/.test(t) ? "" : "."}` : t;
  };
  const place = (path: string, message: string) => {
    const p = path
      .replace(/^equilibrium\./, "")
      .replace(/\[(\d+)\]/g, ".$1")
      .replace(/^pressureBar/, "pressure");
    const field = /^(feedUnit|pressure|key|feed(\..+)?|reactions\.\d+)$/.test(p) ? p : null;
    if (field && !out[field]) out[field] = sentence(message);
    return field !== null;
  };
  let placed = false;
  for (const [f, m] of Object.entries(error.details?.fields ?? {})) placed = place(f, m) || placed;
  if (!placed) {
    const missing = /^species "(.+)" is used in equilibrium\.reactions\[(\d+)\]/.exec(error.message);
    const pathed = /^(equilibrium\.[A-Za-z]+(?:\[\d+\])?): (.*)$/.exec(error.message);
    if (missing) placed = place(`reactions.${missing[2]}`, `${missing[1]} has no model version: pick one below, or check the spelling`);
    else if (pathed) placed = place(pathed[1], pathed[2].replace(/^reaction "[^"]*": /, ""));
  }
  if (!placed) out._ = sentence(error.message.replace(/^[A-Za-z.[\]0-9]+: /, ""));
  return out;
}

export type EquilibriumFormProps = {
  caseId: number;
  lockVersion: number;
  initial: CaseEquilibrium | null;
  caseKeys: string[];
  reactantKeys: string[];
  /** The case's results (snapshot or live), shared with the results view. */
  data: CaseResults | undefined;
};

export type Action = "trial" | "save" | "clear" | "sources";

/**
 * The state of the equilibrium panel: the fields as typed, the species they imply (reaction
 * species and inert ones), every field's message, and the four things it does — solve a trial,
 * save to the case, remove from the case, compare data families.
 */
export function useEquilibriumForm({ caseId, lockVersion, initial, caseKeys, reactantKeys, data }: EquilibriumFormProps) {
  const router = useRouter();
  const [rows, setRows] = useState<Row[]>(() => {
    const feed = initial?.feed ?? Object.fromEntries(caseKeys.map((k) => [k, reactantKeys.includes(k) ? 1 : 0]));
    const keys = [...new Set([...caseKeys, ...Object.keys(feed)])];
    return keys.map((k) => ({ key: k, amount: String(feed[k] ?? 0) }));
  });
  const [unit, setUnit] = useState<string>(initial?.feedUnit ?? "mol");
  const [pressure, setPressure] = useState(String(initial?.pressure ?? "1 bar"));
  const [key, setKey] = useState(initial?.key ?? reactantKeys[0] ?? caseKeys[0]);
  const [reactionsText, setReactionsText] = useState((initial?.reactions ?? []).join("\n"));
  const [extraPins, setExtraPins] = useState<Record<string, number>>(() =>
    Object.fromEntries((initial?.extraTerms ?? []).map((t) => [t.phase ? `${t.formula}(${t.phase})` : t.formula, t.versionId])),
  );
  const [gasModel, setGasModel] = useState<"ideal" | "peng-robinson">(initial?.gas ?? "ideal");
  const [inletK, setInletK] = useState(initial?.adiabaticInletK === null || initial?.adiabaticInletK === undefined ? "" : String(initial.adiabaticInletK));
  const [newKey, setNewKey] = useState("");
  const [trial, setTrial] = useState<EvaluateResult | null>(null);
  const [busy, setBusy] = useState<Action | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState<string | null>(null);
  const [sources, setSources] = useState<SourcesDto | null>(null);
  // The write: the case's feed is replaced (or removed).
  const store = useSWRMutation(`/api/v1/equilibrium/cases/${caseId}`, (url: string, { arg }: { arg: { lockVersion: number; equilibrium: CaseEquilibrium | null } }) =>
    sendJson("PUT", url, arg),
  );

  const reactions = reactionsText
    .split("\n")
    .map((l) => l.trim())
    .filter(Boolean);
  const reactionErrors = reactions.flatMap((_, i) => (errors[`reactions.${i}`] ? [`Line ${i + 1}: ${errors[`reactions.${i}`]}`] : []));
  // Species come only from lines that read as reactions; a malformed line is flagged, not mined for names.
  const reactionKeys = [...new Set(reactions.filter((r) => checkReactionLine(r) === null).flatMap(keysOfReaction))].filter((k) => !caseKeys.includes(k));
  // Inert species carry heat in the adiabatic balance, so they need a pinned model version too.
  const inertKeys = rows.map((r) => r.key).filter((k) => !caseKeys.includes(k) && !reactionKeys.includes(k));
  const extraKeys = [...reactionKeys, ...(inletK.trim() ? inertKeys : [])];
  const feedKeys = [...new Set([...rows.map((r) => r.key), ...extraKeys])];

  /** Drop the message of one field (and, for a feed amount, the feed's own). */
  const clearError = (field: string) =>
    setErrors((all) =>
      Object.fromEntries(
        Object.entries(all).filter(([f]) => f !== field && !(field.startsWith("feed.") && f === "feed") && !(field === "reactions" && f.startsWith("reactions."))),
      ),
    );

  const amountOf = (k: string) => rows.find((r) => r.key === k)?.amount ?? "0";
  const setAmount = (k: string, v: string) => {
    clearError(`feed.${k}`);
    setRows((rs) => (rs.some((r) => r.key === k) ? rs.map((r) => (r.key === k ? { ...r, amount: v } : r)) : [...rs, { key: k, amount: v }]));
  };
  const removable = (k: string) => !caseKeys.includes(k) && !extraKeys.includes(k);
  const removeRow = (k: string) => setRows((rs) => rs.filter((r) => r.key !== k));
  const addInert = () => {
    const k = newKey.trim();
    const bad = checkSpeciesKey(k) ?? (feedKeys.includes(k) ? `${k} is already in the feed.` : null);
    if (bad) {
      setErrors((e) => ({ ...e, inert: bad }));
      return;
    }
    setRows((rs) => [...rs, { key: k, amount: "0" }]);
    setNewKey("");
  };
  const setPin = (k: string, versionId: number) => setExtraPins((p) => ({ ...p, [k]: versionId }));

  const equilibrium = (): CaseEquilibrium => {
    const amounts = new Map(rows.map((r) => [r.key, Number(r.amount)]));
    const feed: Record<string, number> = {};
    for (const k of feedKeys) feed[k] = Number.isFinite(amounts.get(k)) ? amounts.get(k)! : 0;
    const extraTerms: ExtraTerm[] = extraKeys.map((k) => ({ ...markerless(k), versionId: extraPins[k] ?? 0 }));
    const p = pressure.trim();
    const isNumber = (v: string) => /^[-+]?\d*\.?\d+(e[-+]?\d+)?$/i.test(v);
    const t = inletK.trim();
    return {
      feed,
      feedUnit: unit.trim() || "mol",
      pressure: isNumber(p) ? Number(p) : p,
      key: key || null,
      reactions,
      extraTerms,
      ...(gasModel === "peng-robinson" ? { gas: gasModel } : {}),
      ...(t ? { adiabaticInletK: isNumber(t) ? Number(t) : t } : {}),
      // Feed rows that are in no reaction were added as inert species: say so, or the server refuses them.
      inert: feedKeys.filter((k) => !caseKeys.includes(k) && !extraKeys.includes(k)),
    };
  };

  const run = async (what: Action) => {
    setSaved(null);
    if (what === "trial" || what === "save") {
      // Every field is checked at once; nothing is sent while any is wrong.
      const found = checkEquilibriumForm({ amounts: Object.fromEntries(feedKeys.map((k) => [k, amountOf(k)])), feedUnit: unit, pressure, key, reactions });
      // An inert still waiting in its field to be added keeps its message.
      const inert = newKey.trim() ? checkSpeciesKey(newKey) : null;
      if (inert) found.inert = inert;
      setErrors(found);
      if (Object.keys(found).length) return;
    } else setErrors({});
    setBusy(what);
    try {
      if (what === "trial") {
        setTrial(await sendJson<EvaluateResult>("POST", "/api/v1/equilibrium/preview", { caseId, equilibrium: equilibrium() }));
      } else if (what === "save" || what === "clear") {
        await store.trigger({ lockVersion, equilibrium: what === "clear" ? null : equilibrium() });
        setTrial(null);
        setSaved(what === "clear" ? "Equilibrium removed from the case." : "Saved to the case.");
        // The refreshed page brings the case's new lockVersion, and with it the results are asked for again (useCaseResults).
        router.refresh();
      } else if (data) {
        const shown = trial ?? data.result;
        const eqReq = trial
          ? {
              feed: equilibrium().feed,
              feedUnit: unit,
              pressureBar: equilibrium().pressure,
              key: key || undefined,
              ...(reactions.length ? { reactions } : {}),
              ...(gasModel === "peng-robinson" ? { gas: gasModel } : {}),
            }
          : data.request.equilibrium;
        const keys = [...new Set([...Object.keys(data.request.species), ...(trial ? extraKeys : [])])];
        setSources(
          await sendJson<SourcesDto>("POST", "/api/v1/equilibrium/sources", {
            reaction: data.request.reaction,
            species: Object.fromEntries(keys.map((k) => [k, {}])),
            temperatures: data.request.temperatures,
            referenceK: data.request.referenceK,
            ...(shown.equilibrium && eqReq ? { equilibrium: eqReq } : {}),
          }),
        );
      }
    } catch (e) {
      setErrors(panelErrors(e instanceof ApiError ? e : { message: e instanceof Error ? e.message : String(e) }));
    } finally {
      setBusy(null);
    }
  };

  return {
    fields: { unit, setUnit, pressure, setPressure, key, setKey, reactionsText, setReactionsText, gasModel, setGasModel, inletK, setInletK, newKey, setNewKey },
    species: { feedKeys, extraKeys, reactionKeys, extraPins, setPin, amountOf, setAmount, removable, removeRow, addInert },
    errors,
    reactionErrors,
    clearError,
    trial,
    busy,
    saved,
    sources,
    run,
  };
}

export type EquilibriumForm = ReturnType<typeof useEquilibriumForm>;
