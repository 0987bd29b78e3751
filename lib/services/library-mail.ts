import "server-only";
import type { Transaction } from "sequelize";
import type { Actor } from "@/lib/auth/guards";
import { env } from "@/lib/env";
import { models } from "@/lib/db";
import { enqueueMail, enqueueMailToRoles } from "./mail";

type VersionRef = { id: number; versionNumber: number; status: string; authorId: number | null; decisionReason: string | null; model: { name: string }; species: { formula: string } };

const link = (id: number) => `${env.APP_URL.replace(/\/$/, "")}/library/versions/${id}`;

/** Stewards (other than the author) hear that a version waits for them. */
export async function notifyProposed(transaction: Transaction, me: Actor, v: VersionRef): Promise<void> {
  await enqueueMailToRoles(
    transaction,
    me.teamId,
    ["steward"],
    {
      kind: "model-proposed",
      subject: `Proposed: ${v.model.name}, version ${v.versionNumber}`,
      text: `${me.name} proposed version ${v.versionNumber} of ${v.model.name} (${v.species.formula}) and asks a steward other than the author to approve or reject it.\n\nOpen it: ${link(v.id)}\n`,
    },
    { exceptUserId: v.authorId ?? undefined },
  );
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
