import "server-only";
import type { Transaction } from "sequelize";
import type { Actor } from "@/lib/auth/guards";
import { env } from "@/lib/env";
import { models } from "@/lib/db";
import { enqueueMail, enqueueMailToRoles } from "./mail";

type VersionRef = {
  id: number;
  versionNumber: number;
  status: string;
  authorId: number | null;
  decisionReason: string | null;
  model: { name: string };
  species: { formula: string };
  /** Everyone who took part (author, editors, proposer, sources, the dataset's uploader): none may decide. */
  contributors?: readonly { userId: number }[];
};

const link = (id: number) => `${env.APP_URL.replace(/\/$/, "")}/library/versions/${id}`;

/**
 * The stewards who may decide hear that a version waits for them: every steward of the team
 * except the version's contributors (four-eyes), who could not approve or reject it anyway.
 */
export async function notifyProposed(transaction: Transaction, me: Actor, v: VersionRef): Promise<void> {
  const except = [...(v.authorId != null ? [v.authorId] : []), ...(v.contributors ?? []).map((c) => c.userId)];
  const message = {
    kind: "model-proposed" as const,
    subject: `Proposed: ${v.model.name}, version ${v.versionNumber}`,
    text: `${me.name} proposed version ${v.versionNumber} of ${v.model.name} (${v.species.formula}) and asks a steward who took no part in it to approve or reject it.\n\nOpen it: ${link(v.id)}\n`,
  };
  const sent = await enqueueMailToRoles(transaction, me.teamId, ["steward"], message, { exceptUserIds: except });
  // When every steward took part, the admins (who may also decide) hear of it instead.
  if (!sent) await enqueueMailToRoles(transaction, me.teamId, ["admin"], message, { exceptUserIds: except });
}

/** The author hears the decision, with the reason when there is one. */
export async function notifyDecided(transaction: Transaction, me: Actor, v: VersionRef): Promise<void> {
  if (v.authorId == null) return;
  const author = await models().User.findByPk(v.authorId, { transaction });
  if (!author) return;
  const verdict = v.status === "approved" ? "approved" : "rejected";
  await enqueueMail(transaction, {
    to: author.email,
    teamId: me.teamId,
    kind: "model-decided",
    subject: `Version ${v.versionNumber} of ${v.model.name} was ${verdict}`,
    text: `${me.name} ${verdict} version ${v.versionNumber} of ${v.model.name} (${v.species.formula}).${v.decisionReason ? `\n\nReason: ${v.decisionReason}` : ""}\n\nOpen it: ${link(v.id)}\n`,
  });
}
