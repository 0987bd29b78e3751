import "server-only";
import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { parseWith } from "@/lib/http";
import { runEngine } from "@/lib/engine-pool";
import type { EvaluateResult } from "@/lib/thermo";
import { caseEquilibriumSchema } from "@/lib/validation/equilibrium";
import { caseInputSchema } from "@/lib/validation/cases";
import { getCase, updateCase, type CaseDto } from "./cases";
import { requestFor } from "./cases/queries";
import { pinTerms } from "@/lib/cases/equilibrium";
import { loadPins } from "./pins";

/** A case's equilibrium: trial runs and saving (the request parts live in ./equilibrium, which cases.ts uses). */

const previewSchema = strictObject({
  caseId: z.number({ error: "Send the case id." }).int().positive(),
  equilibrium: caseEquilibriumSchema,
});
const saveSchema = strictObject({
  lockVersion: z.number({ error: "Send the lockVersion you loaded." }).int().min(0),
  equilibrium: caseEquilibriumSchema.nullable(),
});

/**
 * Evaluate a case with a trial equilibrium (not saved): the case's pinned versions plus the
 * extra species' versions, the case's grid. Members of the case's team only.
 */
export async function previewCaseEquilibrium(actor: Actor | null, readBody: () => Promise<unknown>): Promise<EvaluateResult> {
  const me = requirePermission(actor, "evaluate.run");
  const body = parseWith(previewSchema, await readBody());
  const c = await getCase(me, body.caseId);
  // The whole case with this feed, checked as a case edit is (feed keys against the reaction's species).
  const { equilibrium } = parseWith(caseInputSchema, { title: c.title, notes: c.notes, ...c.inputs, equilibrium: body.equilibrium });
  const inputs = { ...c.inputs, equilibrium };
  const pins = await loadPins(me.teamId, pinTerms(inputs), { allowAny: true });
  return runEngine(await requestFor(me.teamId, inputs, pins));
}

/** Save (or clear, with null) a draft case's equilibrium: an ordinary case edit, audited, lock-checked. */
export async function saveCaseEquilibrium(actor: Actor | null, caseId: number, readBody: () => Promise<unknown>): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.create");
  const body = parseWith(saveSchema, await readBody());
  const c = await getCase(me, caseId);
  parseWith(caseInputSchema, { title: c.title, notes: c.notes, ...c.inputs, equilibrium: body.equilibrium });
  if (body.equilibrium?.extraTerms.length) {
    // Extra species must be visible and current, as a new pin would be.
    await loadPins(
      me.teamId,
      body.equilibrium.extraTerms.map((t) => ({ ...t, coefficient: 1 })),
    );
  }
  return updateCase(me, caseId, { title: c.title, notes: c.notes, ...c.inputs, equilibrium: body.equilibrium, lockVersion: body.lockVersion });
}
