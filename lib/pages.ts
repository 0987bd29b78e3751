import { notFound } from "next/navigation";
import { AppError } from "@/lib/errors";

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
