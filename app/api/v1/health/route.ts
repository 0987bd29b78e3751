import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { json, parseWith, queryObject, route } from "@/lib/http";
import { deepHealth } from "@/lib/services/health";

export const dynamic = "force-dynamic";

const querySchema = strictObject({ deep: z.enum(["0", "1"], { error: "Use deep=1 (or leave it out)." }).optional() });

/** `GET /api/v1/health`: the process answers. `?deep=1`: it also reaches the database, and the mail queue moves. */
export const GET = route(async (request) => {
  const { deep } = parseWith(querySchema, queryObject(request));
  if (deep !== "1") return json({ status: "ok" });
  const health = await deepHealth();
  return json(health, health.status === "unavailable" ? 503 : 200, { "cache-control": "no-store" });
});
