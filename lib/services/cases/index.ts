/**
 * The case service: what pages, route handlers and other services call. Every function here
 * authorises the actor (lib/auth/permissions.ts) and answers with DTOs; the row helpers of
 * ./queries and ./commands stay inside this folder. The pure parts (request, snapshot hash,
 * diff, CSV) live in lib/cases/.
 */
export { diffSnapshots, exportCsv, getCase, getResults, getSnapshot, listCases, listComments, listSnapshots } from "./queries";
export { addComment, createCase, rerunWithNewerVersions, submitCase, updateCase } from "./commands";
export type { CaseDto, CaseSummaryDto, PinDto, ResultsDto } from "./present";
