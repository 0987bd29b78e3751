/**
 * The library service (docs/library.md): every function authorises its actor and returns DTOs.
 * Row-level helpers for sibling services live in ./rows, outside this entry point.
 */
export { exportLibrary, getModel, getSpecies, getVersion, listModels, listSpecies, previewCurve, versionAudit, versionCurve } from "./queries";
export { approveVersion, copyReferenceVersion, createModel, createSpecies, createVersion, editVersion, importLibrary, proposeVersion, rejectVersion } from "./commands";
export type { VersionDto } from "./present";
