import "server-only";
import { Op, type Transaction } from "sequelize";
import { requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { pinTerms } from "@/lib/cases/equilibrium";
import { db, models } from "@/lib/db";
import { env } from "@/lib/env";
import { notFound } from "@/lib/errors";
import { runEngine } from "@/lib/engine-pool";
import type { EvaluateRequest, EvaluateResult } from "@/lib/thermo";
import type { Case } from "@/models/case";
import type { PinnedVersion } from "@/models/case-snapshot";
import type { ImpactCase, ImpactJob, ImpactStatus, ImpactTrigger } from "@/models/impact-job";
import type { ModelVersion } from "@/models/model-version";
import { requestFor } from "./cases/queries";
import { enqueueMail } from "./mail";
import { loadPins } from "./pins";

/**
 * What a model change does to every case: the team's cases pinned to an older version of the
 * model, each evaluated as it stands and with its pin moved to the new version, compared point
 * by point. Runs as a background job (lib/impact-worker.ts), never on the request thread: the
 * runner evaluates one case at a time and yields to the event loop between evaluations.
 */

export type ImpactJobDto = {
  id: number;
  status: ImpactStatus;
  trigger: ImpactTrigger;
  total: number;
  done: number;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
};

export type ImpactDto = {
  versionId: number;
  versionNumber: number;
  modelName: string;
  job: ImpactJobDto | null;
  cases: ImpactCase[];
};

const ACTIVE: ImpactStatus[] = ["queued", "running"];
/** Shortest interval between progress writes of a running job. */
const PROGRESS_MS = 500;
const KICK = Symbol.for("heatpath.impact.kick");

/** The worker registers this to be woken when a job is queued. */
export function setImpactKick(kick: (() => void) | undefined): void {
  (globalThis as { [KICK]?: () => void })[KICK] = kick;
}
const kick = () => (globalThis as { [KICK]?: () => void })[KICK]?.();

async function versionWithModel(id: number, transaction?: Transaction): Promise<ModelVersion> {
  const { ModelVersion, CpModel } = models();
  const v = await ModelVersion.findByPk(id, { include: [{ model: CpModel, as: "model" }], transaction });
  if (!v) throw notFound("Model version");
  return v;
}

function jobDto(j: ImpactJob): ImpactJobDto {
  return {
    id: j.id,
    status: j.status,
    trigger: j.trigger,
    total: j.total,
    done: j.done,
    error: j.error,
    createdAt: j.createdAt.toISOString(),
    startedAt: j.startedAt?.toISOString() ?? null,
    finishedAt: j.finishedAt?.toISOString() ?? null,
  };
}

async function dtoOf(v: ModelVersion, job: ImpactJob | null): Promise<ImpactDto> {
  return { versionId: v.id, versionNumber: v.versionNumber, modelName: v.model?.name ?? "", job: job ? jobDto(job) : null, cases: job?.cases ?? [] };
}

/** The latest impact run of a version for the actor's team (`job: null` before the first). */
export async function getImpact(actor: Actor | null, versionId: number): Promise<ImpactDto> {
  const me = requirePermission(actor, "library.view");
  const v = await versionWithModel(versionId);
  if (v.teamId !== null) requireSameTeam(me, v.teamId, "Model version");
  const job = await models().ImpactJob.findOne({ where: { versionId, teamId: me.teamId }, order: [["id", "DESC"]] });
  return dtoOf(v, job);
}

/**
 * Queue an impact run for the actor's team (engineers, stewards, admins). While one is queued
 * or running for the same version and team, that one is returned instead of a second.
 */
export async function startImpact(actor: Actor | null, versionId: number): Promise<ImpactDto> {
  const me = requirePermission(actor, "models.draft");
  const v = await versionWithModel(versionId);
  if (v.teamId !== null) requireSameTeam(me, v.teamId, "Model version");
  const job = await db().transaction(async (transaction) => {
    const active = await models().ImpactJob.findOne({ where: { versionId, teamId: me.teamId, status: { [Op.in]: ACTIVE } }, transaction });
    return active ?? queueImpactJob(transaction, { teamId: me.teamId, versionId, trigger: "manual", notify: false, requestedById: me.userId });
  });
  return dtoOf(v, job);
}

/** Queue a run inside a caller's transaction (propose, approve); the worker is woken after commit. */
export async function queueImpactJob(
  transaction: Transaction,
  input: { teamId: number; versionId: number; trigger: ImpactTrigger; notify: boolean; requestedById: number | null },
): Promise<ImpactJob> {
  const job = await models().ImpactJob.create({ ...input, status: "queued", cases: [], error: null, notifiedAt: null, startedAt: null, finishedAt: null }, { transaction });
  transaction.afterCommit(() => kick());
  return job;
}

/** Cases of the team that pin a version of the model older than `v` (by version number). */
async function affectedCases(teamId: number, v: ModelVersion): Promise<{ row: Case; older: number[] }[]> {
  const { ModelVersion, Case } = models();
  const older = await ModelVersion.findAll({ where: { modelId: v.modelId, versionNumber: { [Op.lt]: v.versionNumber } }, attributes: ["id", "versionNumber"] });
  const numberOf = new Map(older.map((o) => [o.id, o.versionNumber]));
  if (numberOf.size === 0) return [];
  const rows = await Case.findAll({ where: { teamId }, order: [["id", "ASC"]] });
  const out: { row: Case; older: number[] }[] = [];
  for (const row of rows) {
    const pinned = pinTerms(row.inputs)
      .map((t) => t.versionId)
      .filter((id) => numberOf.has(id));
    if (pinned.length) out.push({ row, older: [...new Set(pinned.map((id) => numberOf.get(id)!))].sort((a, b) => a - b) });
  }
  return out;
}

const yieldToLoop = () => new Promise<void>((resolve) => setImmediate(resolve));
/**
 * After each case the runner rests as long as the case took (capped): at most half of the
 * machine's time goes to a background run, so other members' requests keep their latency
 * (measured by `npm run bench:impact`).
 */
const REST_CAP_MS = 250;
const rest = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, Math.min(REST_CAP_MS, Math.max(0, ms))));

/**
 * Evaluate a request off the request path: on the engine pool's worker threads
 * (lib/engine-pool.ts), with its time budget; the event loop only waits.
 */
async function evaluateInSlice(request: EvaluateRequest): Promise<EvaluateResult> {
  await yieldToLoop();
  return runEngine(request);
}

const maxAbs = (a: number[], b: number[]) => a.reduce((m, v, i) => Math.max(m, Math.abs(v - b[i])), 0);

/** Compare a case before and after the pin moves to `v`. */
async function impactOfCase(teamId: number, row: Case, older: number[], v: ModelVersion): Promise<ImpactCase> {
  const base: ImpactCase = {
    caseId: row.id,
    title: row.title,
    status: row.status,
    authorId: row.authorId,
    pinnedVersionNumbers: older,
    maxDiffKJ: null,
    maxDiffLog10K: null,
    maxDiffKeyFraction: null,
    crossoversBefore: [],
    crossoversAfter: [],
    signCaseBefore: null,
    signCaseAfter: null,
    exceedsTolerance: false,
    error: null,
  };
  let before: EvaluateResult;
  let pins: PinnedVersion[];
  try {
    pins = await loadPins(teamId, pinTerms(row.inputs), { allowAny: true });
    before = await evaluateInSlice(await requestFor(teamId, row.inputs, pins));
  } catch (e) {
    return { ...base, error: `the case as it stands cannot be evaluated: ${(e as Error).message}` };
  }
  base.crossoversBefore = before.crossover.correctedK;
  base.signCaseBefore = before.signCase.code;
  const moved = pins.map((p): PinnedVersion =>
    p.modelId === v.modelId
      ? { ...p, versionId: v.id, versionNumber: v.versionNumber, status: v.status, citation: v.citation, data: v.data, uncertainty: v.uncertainty ?? null }
      : p,
  );
  let after: EvaluateResult;
  try {
    after = await evaluateInSlice(await requestFor(teamId, row.inputs, moved));
  } catch (e) {
    return { ...base, exceedsTolerance: true, error: `version ${v.versionNumber} cannot evaluate this case: ${(e as Error).message}` };
  }
  const dKJ = maxAbs(
    after.points.map((p) => p.dGkJ),
    before.points.map((p) => p.dGkJ),
  );
  const dLog = maxAbs(
    after.points.map((p) => p.log10K),
    before.points.map((p) => p.log10K),
  );
  let dKey: number | null = null;
  if (before.equilibrium && after.equilibrium) {
    dKey = maxAbs(
      after.equilibrium.map((p) => p.keyFraction ?? 0),
      before.equilibrium.map((p) => p.keyFraction ?? 0),
    );
  }
  const tolKJ = row.inputs.toleranceKJ;
  const factor = row.inputs.toleranceKFactor;
  return {
    ...base,
    maxDiffKJ: dKJ,
    maxDiffLog10K: dLog,
    maxDiffKeyFraction: dKey,
    crossoversAfter: after.crossover.correctedK,
    signCaseAfter: after.signCase.code,
    exceedsTolerance: dKJ > tolKJ || (factor !== null && factor !== undefined && dLog > Math.log10(factor)),
  };
}

/** Claim the oldest queued job atomically; null when there is none. */
async function claimJob(): Promise<ImpactJob | null> {
  const { ImpactJob } = models();
  for (let attempt = 0; attempt < 3; attempt++) {
    const next = await ImpactJob.findOne({ where: { status: "queued" }, order: [["id", "ASC"]] });
    if (!next) return null;
    const [n] = await ImpactJob.update({ status: "running", startedAt: new Date() }, { where: { id: next.id, status: "queued" } });
    if (n === 1) return ImpactJob.findByPk(next.id);
  }
  return null;
}

const caseLink = (id: number) => `${env.APP_URL.replace(/\/$/, "")}/cases/${id}`;
const versionLink = (id: number) => `${env.APP_URL.replace(/\/$/, "")}/library/versions/${id}`;
const fmt = (x: number | null, digits = 3) => (x === null ? "—" : String(Number(x.toPrecision(digits))));

/** One mail per author of an affected case, listing their cases (after approval). */
async function notifyAuthors(job: ImpactJob, v: ModelVersion): Promise<void> {
  const byAuthor = new Map<number, ImpactCase[]>();
  for (const c of job.cases) byAuthor.set(c.authorId, [...(byAuthor.get(c.authorId) ?? []), c]);
  await db().transaction(async (transaction) => {
    const authors = await models().User.findAll({ where: { id: { [Op.in]: [...byAuthor.keys()] } }, transaction });
    for (const author of authors) {
      const list = byAuthor.get(author.id)!;
      const lines = list.map((c) => {
        const change = c.error
          ? c.error
          : `largest change ${fmt(c.maxDiffKJ)} kJ/mol in ΔrG, ${fmt(c.maxDiffLog10K)} in log10 K${c.exceedsTolerance ? " — beyond the case's tolerance" : ""}`;
        return `- ${c.title} (${c.status}, pins v${c.pinnedVersionNumbers.join(", v")}): ${change}\n  ${caseLink(c.caseId)}`;
      });
      await enqueueMail(transaction, {
        to: author.email,
        teamId: job.teamId,
        kind: "model-impact",
        subject: `${v.model?.name ?? "A model"} v${v.versionNumber} was approved: ${list.length} of your case${list.length > 1 ? "s" : ""} pin${list.length > 1 ? "" : "s"} an older version`,
        text: `Version ${v.versionNumber} of ${v.model?.name ?? "the model"} was approved. These cases of yours pin an older version; re-evaluated on the new one:\n\n${lines.join("\n")}\n\nEach case page offers "Re-run with newer versions". The version: ${versionLink(v.id)}\n`,
      });
    }
    await job.update({ notifiedAt: new Date() }, { transaction });
  });
}

/** Run one claimed job to the end, writing progress as it goes. */
async function runJob(job: ImpactJob): Promise<void> {
  try {
    const v = await versionWithModel(job.versionId);
    const list = await affectedCases(job.teamId, v);
    await job.update({ total: list.length, done: 0, cases: [] });
    const out: ImpactCase[] = [];
    let written = Date.now();
    for (const { row, older } of list) {
      const started = Date.now();
      out.push(await impactOfCase(job.teamId, row, older, v));
      await rest(Date.now() - started);
      // Progress at most twice a second (and after the last case), not one growing JSON write per case.
      if (Date.now() - written >= PROGRESS_MS || out.length === list.length) {
        await job.update({ done: out.length, cases: [...out] });
        written = Date.now();
      }
    }
    await job.update({ status: "done", finishedAt: new Date() });
    if (job.notify && out.length > 0) await notifyAuthors(job, v);
  } catch (e) {
    await job.update({ status: "failed", error: (e as Error).message, finishedAt: new Date() });
  }
}

/** Run queued jobs until none is left (the worker's tick; tests call it directly). Returns how many ran. */
export async function runQueuedImpactJobs(): Promise<number> {
  let ran = 0;
  for (let job = await claimJob(); job; job = await claimJob()) {
    await runJob(job);
    ran++;
  }
  return ran;
}

/** Jobs left running by a process that stopped (started more than `olderThanMs` ago) go back to the queue. */
export async function requeueStaleImpactJobs(olderThanMs = 10 * 60 * 1000): Promise<number> {
  const [n] = await models().ImpactJob.update({ status: "queued", startedAt: null }, { where: { status: "running", startedAt: { [Op.lt]: new Date(Date.now() - olderThanMs) } } });
  return n;
}
