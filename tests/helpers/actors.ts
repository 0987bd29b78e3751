import type { Actor } from "@/lib/auth/guards";
import { startSession } from "@/lib/auth/session";
import { actorFor } from "@/lib/services/auth";
import { models } from "@/lib/db";
import { cookieJar } from "./cookies";

export type Who = "anonymous" | "engineer" | "steward" | "steward2" | "reviewer" | "admin" | "other";

const EMAIL: Record<Exclude<Who, "anonymous">, string> = {
  engineer: "erin.engineer@example.test",
  steward: "sam.steward@example.test",
  steward2: "stella.steward@example.test",
  reviewer: "rory.reviewer@example.test",
  admin: "alex.admin@example.test",
  other: "tom.tansy@example.test",
};

export const ALL_WHO: Who[] = ["anonymous", "engineer", "steward", "reviewer", "admin", "other"];

export async function actorOf(who: Exclude<Who, "anonymous">): Promise<Actor> {
  const user = await models().User.findOne({ where: { email: EMAIL[who] } });
  if (!user) throw new Error(`demo account ${EMAIL[who]} is not seeded`);
  return (await actorFor(user.id))!;
}

/** Put a real sealed session cookie for `who` into the jar (or empty it). */
export async function signInAs(who: Who): Promise<Actor | null> {
  cookieJar.clear();
  if (who === "anonymous") return null;
  const actor = await actorOf(who);
  await startSession(actor.userId, actor.teamId);
  return actor;
}
