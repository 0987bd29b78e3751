import type { Who } from "../../helpers/actors";

export type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;
/** Expected status for each caller; `other` is a member (admin) of another team. */
export type Expect = Record<Exclude<Who, "steward2">, number>;

/** One route handler × method, with what each caller must get. */
export type Row = {
  name: string;
  /** Path under app/api/v1, as the folder is named: `team/members/[id]`. */
  file: string;
  method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  handler: Handler;
  /** A query string for the request URL, without the `?`: `deep=1`. */
  query?: string;
  /** Fresh params and body for each call, since some calls consume records. Runs before signing in. */
  prepare?: () => Promise<{ params?: Record<string, string>; body?: unknown; headers?: Record<string, string> }>;
  expect: Expect;
  /**
   * The author of the record as a caller of their own: the record is prepared as `who`'s work
   * and `who` calls. Four-eyes routes expect a refusal here even where the role may act.
   */
  author?: { who: Exclude<Who, "anonymous" | "other">; prepare: () => Promise<{ params?: Record<string, string>; body?: unknown }>; expect: number };
  /**
   * Four-eyes beyond authorship: someone who changed or proposed the record (an editor, the
   * proposer, a copier) calls. Each entry prepares the record with `who` as that contributor.
   */
  contributors?: { as: string; who: Exclude<Who, "anonymous" | "other">; prepare: () => Promise<{ params?: Record<string, string>; body?: unknown }>; expect: number }[];
};

export const allowAll = (status: number): Expect => ({ anonymous: 401, engineer: status, steward: status, reviewer: status, admin: status, other: status });
export const adminOnly = (status: number, other = 404): Expect => ({ anonymous: 401, engineer: 403, steward: 403, reviewer: 403, admin: status, other });
export const everyoneGets = (status: number): Expect => ({ anonymous: status, engineer: status, steward: status, reviewer: status, admin: status, other: status });
