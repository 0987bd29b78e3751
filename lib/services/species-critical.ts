import "server-only";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { db } from "@/lib/db";
import { AppError } from "@/lib/errors";
import type { SpeciesPatchInput } from "@/lib/validation/species-critical";
import type { Species, SpeciesCritical } from "@/models/species";
import { recordAudit } from "./audit";
import { loadSpecies } from "./library/rows";

/**
 * Critical constants (Tc, Pc, acentric factor, with their source) of a species, read by the
 * Peng–Robinson equilibrium: a case pinning a version of the species takes them with its pins
 * (lib/services/pins.ts), an unpinned feed species by formula, the team's own first. The
 * reference library's constants are read-only; a team's steward or admin sets its own species'.
 */

export type SpeciesCriticalDto = {
  speciesId: number;
  scope: "reference" | "team";
  critical: SpeciesCritical | null;
  /** The caller may change them (steward or admin of the owning team); the server checks again. */
  canEdit: boolean;
};

const READ_ONLY = "The reference library's critical constants are read-only; a team's own species carry the team's.";

function dto(me: Actor, s: Species): SpeciesCriticalDto {
  const critical = s.critical ? { tcK: s.critical.tcK, pcBar: s.critical.pcBar, omega: s.critical.omega, citation: s.critical.citation ?? "" } : null;
  return { speciesId: s.id, scope: s.teamId === null ? "reference" : "team", critical, canEdit: s.teamId === me.teamId && can(me.role, "models.edit") };
}

/** The constants of a visible species (reference or the actor's team); another team's is 404. */
export async function getSpeciesCritical(actor: Actor | null, id: number): Promise<SpeciesCriticalDto> {
  const me = requirePermission(actor, "library.view");
  return dto(me, await loadSpecies(me, id));
}

/** Set (or, with `critical: null`, remove) a team species' constants, with an audit event. */
export async function setSpeciesCritical(actor: Actor | null, id: number, input: SpeciesPatchInput): Promise<SpeciesCriticalDto> {
  const me = requirePermission(actor, "models.edit");
  return db().transaction(async (transaction) => {
    const s = await loadSpecies(me, id, transaction);
    if (s.teamId === null) throw new AppError(403, "read-only", READ_ONLY);
    const before = s.critical ?? null;
    const after = input.critical ? { tcK: input.critical.tcK, pcBar: input.critical.pcBar, omega: input.critical.omega, citation: input.critical.citation } : null;
    await s.update({ critical: after }, { transaction });
    await recordAudit(transaction, {
      action: after ? "species.critical-set" : "species.critical-removed",
      entityType: "species",
      entityId: s.id,
      teamId: me.teamId,
      actorId: me.userId,
      before: { formula: s.formula, critical: before },
      after: { formula: s.formula, critical: after },
    });
    return dto(me, s);
  });
}
