import { forbidden, notFound } from "next/navigation";
import { requireUser, type Actor } from "@/lib/auth/guards";
import { can, type Action } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { idParamSchema } from "@/lib/validation/params";

/**
 * For pages: a signed-in member whose role lacks `action` gets the framework's 403 page
 * (app/forbidden.tsx), not the error page. Services still check again on every call.
 */
export function pagePermission(actor: Actor | null | undefined, action: Action): Actor {
  const me = requireUser(actor);
  if (!can(me.role, action)) forbidden();
  return me;
}

/**
 * For pages: a service's 404 (a missing record, or another team's) becomes the
 * framework's not-found page; any other failure goes to the error page.
 */
export async function orNotFound<T>(work: Promise<T>): Promise<T> {
  try {
    return await work;
  } catch (error) {
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  }
}

/** For pages under an `[id]` segment: the id by the API's rule (idParamSchema), else the not-found page. */
export async function pageId(params: Promise<{ id: string }>): Promise<number> {
  const parsed = idParamSchema.safeParse((await params).id);
  if (!parsed.success) notFound();
  return parsed.data;
}
