// The ingest pipeline: one path for the HTTP API, the upload page and the demo seed.
export { ingestFiles, type FileOutcome, type IncomingFile } from "./ingestFile";
export { requestReanalysis, type ReanalysisResult } from "./requestReanalysis";
export { ingestMetadataSchema, INGEST_FIELDS, type IngestMetadata, type IngestMetadataInput } from "./metadata";
export { ingestLimits, type IngestLimits } from "./limits";
export { parameterHash, type AnalysisParameters } from "./parameters";
export type { StoredFile } from "./storeFile";
