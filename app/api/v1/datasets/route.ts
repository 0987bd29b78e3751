import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { listDatasets, uploadDataset } from "@/lib/services/datasets";
import { DATASET_MAX_BYTES, datasetUploadSchema } from "@/lib/validation/library";

export const GET = route(async () => json({ datasets: await listDatasets(await getActor()) }));

// JSON escaping can grow the CSV text; the service applies the 1 MB limit to the text itself.
const BODY_LIMIT = DATASET_MAX_BYTES * 2 + 65536;

export const POST = route(async (request) => {
  const actor = await getActor();
  return json({ dataset: await uploadDataset(actor, await readJson(request, datasetUploadSchema, BODY_LIMIT)) }, 201);
});
