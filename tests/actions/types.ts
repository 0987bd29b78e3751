import type { Who } from "../helpers/actors";

/** `ok` for success (a redirect counts), else the status the refusal carries. */
export type Outcome = "ok" | number;
export type ActionExpect = Record<Exclude<Who, "steward2">, Outcome>;

export type ActionRow = {
  /** `app/(app)/team/actions.ts#changeRoleAction` */
  id: string;
  action: (prev: never, formData: FormData) => Promise<unknown>;
  /** Form fields for each call, made fresh (some calls consume records). Runs before signing in. */
  prepare?: () => Promise<Record<string, string>>;
  expect: ActionExpect;
};

export const everyone = (o: Outcome): ActionExpect => ({ anonymous: o, engineer: o, steward: o, reviewer: o, admin: o, other: o });
