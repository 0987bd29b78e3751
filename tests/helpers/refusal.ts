import { AppError } from "@/lib/errors";

/** The AppError a service call is refused with; fails when it succeeds or throws anything else. */
export async function refusal(p: Promise<unknown>): Promise<AppError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof AppError) return e;
    throw e;
  }
  throw new Error("expected a refusal");
}
