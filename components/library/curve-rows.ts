/**
 * Curves from the service → rows and marks for the chart wrappers (which compute nothing).
 * Pure; used by server pages and by the editor's preview.
 */
import type { MarkX, Stretch } from "@/components/charts/line-series-chart";

export type CurveLike = {
  points: { tK: number; cpJ: number; hkJ: number; sJ: number; phase: string; extrapolated: boolean }[];
  chains: { phase: string; tminK: number; tmaxK: number }[];
  /** Where the stable phase changes (the service bisects it); absent in older answers. */
  phaseChanges?: { tK: number; from: string; to: string }[];
};

/**
 * The palette (tailwind.config.ts) as plain values: constants exported from a "use client"
 * module reach a server component only as references, so server pages take colours from here.
 */
export const COLORS = { ember: "#e0591b", frost: "#1f7a99", flag: "#b42323", moss: "#2f7a3b", ink: "#3d4656", muted: "#5f6878" };

export const PHASE_LABELS: Record<string, string> = { cr: "solid", l: "liquid", g: "gas" };
export const phaseLabel = (p: string) => PHASE_LABELS[p] ?? (p.startsWith("cr-") ? `solid ${p.slice(3)}` : p);

/** A point's value where the model is inside its own range, else null (the line stops there). */
const own = (p: CurveLike["points"][number] | undefined, v: number | undefined) => (p && !p.extrapolated && v !== undefined ? v : null);

/**
 * Rows keyed by tK. A (and B) are drawn only over their own ranges (`cp`, `cpB`, … null
 * elsewhere); alone, A's extrapolated stretch is drawn separately (`cpX`, …) so it can be dotted.
 * The difference A − B (`dCp`, …) is given only where both models are inside their ranges.
 */
export function curveRows(a: CurveLike, b?: CurveLike): Record<string, number | null>[] {
  const pts = a.points;
  return pts.map((p, i) => {
    const q = b?.points[i];
    const row: Record<string, number | null> = { tK: p.tK, cp: own(p, p.cpJ), h: own(p, p.hkJ), s: own(p, p.sJ) };
    if (!b) {
      // The extrapolated line meets the in-range one at the range edge.
      const near = p.extrapolated || pts[i - 1]?.extrapolated || pts[i + 1]?.extrapolated;
      Object.assign(row, { cpX: near ? p.cpJ : null, hX: near ? p.hkJ : null, sX: near ? p.sJ : null });
    }
    if (q && Math.abs(q.tK - p.tK) < 1e-9) {
      const both = !p.extrapolated && !q.extrapolated;
      Object.assign(row, {
        cpB: own(q, q.cpJ),
        hB: own(q, q.hkJ),
        sB: own(q, q.sJ),
        dCp: both ? p.cpJ - q.cpJ : null,
        dH: both ? p.hkJ - q.hkJ : null,
        dS: both ? p.sJ - q.sJ : null,
      });
    }
    return row;
  });
}

/** Contiguous runs of extrapolated points, as shaded stretches (in the model's colour when given). */
export function extrapolatedStretches(c: CurveLike, color?: string): Stretch[] {
  const out: Stretch[] = [];
  let start: number | null = null;
  let prev = 0;
  for (const p of c.points) {
    if (p.extrapolated && start === null) start = p.tK;
    if (!p.extrapolated && start !== null) {
      out.push({ x1: start, x2: p.tK, color });
      start = null;
    }
    prev = p.tK;
  }
  if (start !== null) out.push({ x1: start, x2: prev, color });
  return out.filter((s) => s.x2 > s.x1);
}

/**
 * Stretches where both models are inside their ranges (so the difference is drawn) but sit in
 * different phases: there the difference compares phases, not models. Each stretch runs to the
 * phase change that opens or closes it, or half-way to the neighbouring grid point.
 */
export function phaseMismatch(a: CurveLike, b: CurveLike): { x1: number; x2: number; phaseA: string; phaseB: string }[] {
  const changes = [...(a.phaseChanges ?? []), ...(b.phaseChanges ?? [])].map((c) => c.tK);
  const edge = (t1: number, t2: number) => changes.find((c) => c > Math.min(t1, t2) && c < Math.max(t1, t2)) ?? (t1 + t2) / 2;
  const out: { x1: number; x2: number; phaseA: string; phaseB: string }[] = [];
  const pts = a.points;
  const differs = (i: number) => {
    const p = pts[i];
    const q = b.points[i];
    return !!p && !!q && !p.extrapolated && !q.extrapolated && p.phase !== q.phase;
  };
  for (let i = 0; i < pts.length; i++) {
    if (!differs(i)) continue;
    const q = b.points[i];
    const last = out[out.length - 1];
    if (last && differs(i - 1) && last.phaseA === pts[i].phase && last.phaseB === q.phase) {
      last.x2 = i + 1 < pts.length ? edge(pts[i].tK, pts[i + 1].tK) : pts[i].tK;
      continue;
    }
    out.push({
      x1: i > 0 ? edge(pts[i - 1].tK, pts[i].tK) : pts[i].tK,
      x2: i + 1 < pts.length ? edge(pts[i].tK, pts[i + 1].tK) : pts[i].tK,
      phaseA: pts[i].phase,
      phaseB: q.phase,
    });
  }
  return out;
}

type RawMark = { x: number; text: string; color: string; dashed: boolean; tag: string };

/**
 * Range edges of each chain and every phase change inside the plotted span, of A and (overlaid)
 * B. Marks at the same temperature are merged into one label, so they never pile up; the chart
 * stacks the labels that remain close.
 */
export function curveMarks(a: CurveLike, b?: CurveLike, colors: { a: string; b: string } = { a: COLORS.muted, b: COLORS.frost }): MarkX[] {
  const lo = a.points[0]?.tK ?? 0;
  const hi = a.points[a.points.length - 1]?.tK ?? 0;
  const raw: RawMark[] = [];
  const fmt = (t: number) => `${Number(t.toFixed(2))} K`;
  for (const [c, color, tag] of [[a, colors.a, b ? "A " : ""], ...(b ? ([[b, colors.b, "B "]] as const) : [])] as const) {
    for (const pc of c.phaseChanges ?? []) {
      if (pc.tK > lo && pc.tK < hi) raw.push({ x: pc.tK, text: `${tag}${pc.from}→${pc.to} ${fmt(pc.tK)}`, color: COLORS.flag, dashed: false, tag: tag.trim() });
    }
    for (const ch of c.chains) {
      for (const e of [ch.tminK, ch.tmaxK]) if (e > lo && e < hi) raw.push({ x: e, text: `${tag}${fmt(e)}`, color, dashed: true, tag: tag.trim() });
    }
  }
  // Merge marks closer than 0.2 % of the span; a phase change outranks a bare range edge.
  const tol = Math.max(0.05, (hi - lo) * 0.002);
  raw.sort((m, n) => m.x - n.x || (m.dashed ? 1 : 0) - (n.dashed ? 1 : 0));
  const out: MarkX[] = [];
  let group: RawMark[] = [];
  const flush = () => {
    if (!group.length) return;
    const head = group[0];
    const changes = [...new Set(group.filter((g) => !g.dashed).map((g) => g.text))];
    // Range edges at one temperature read once: "200 K", "A 600 K", or "A, B 200 K" when both models end there.
    const tags = [...new Set(group.filter((g) => g.dashed).map((g) => g.tag))].filter(Boolean).sort();
    const edge = group.some((g) => g.dashed) ? `${tags.length ? `${tags.join(", ")} ` : ""}${fmt(head.x)}` : "";
    const label = changes.length ? changes.join(" · ") : edge;
    out.push({ x: head.x, label, color: head.color, dashed: head.dashed });
    group = [];
  };
  for (const m of raw) {
    if (group.length && m.x - group[0].x > tol) flush();
    group.push(m);
  }
  flush();
  return out;
}
