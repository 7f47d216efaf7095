import { ENGINE_VERSION } from "@/lib/engine/version";
import { INGEST_MATERIALS, INGEST_TECHNIQUES } from "./metadata";

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const errorResponse = (description: string) => ({ description, content: { "application/json": { schema: ref("Error") } } });
const idParam = (what: string) => ({ name: "id", in: "path", required: true, description: `${what} id (UUID)`, schema: { type: "string", format: "uuid" } });
const nullable = (type: string, extra: Record<string, unknown> = {}) => ({ type: [type, "null"], ...extra });

/** The OpenAPI 3.1 description of /api/v1, served at /api/v1/openapi.json. */
export function openApiDocument() {
  return {
    openapi: "3.1.0",
    info: {
      title: "Bandkeep API",
      version: "1",
      description:
        "Upload instrument exports and read analyses from lab scripts. Authenticate with `Authorization: Bearer <API token>` " +
        `(create one under Settings) or a browser session. Analysis engine ${ENGINE_VERSION}. Errors always have the shape ` +
        '`{"error": {"code", "message", "field?"}}`.',
    },
    servers: [{ url: "/" }],
    security: [{ bearer: [] }],
    paths: {
      "/api/v1/spectra": {
        post: {
          operationId: "uploadSpectra",
          summary: "Upload one or more exports (or zips of exports) with shared metadata",
          requestBody: {
            required: true,
            content: { "multipart/form-data": { schema: ref("UploadForm"), encoding: { file: { contentType: "application/octet-stream" } } } },
          },
          responses: {
            "201": { description: "At least one file was stored; one outcome per file", content: { "application/json": { schema: ref("UploadResult") } } },
            "200": { description: "Every file was already stored in the project (linked as duplicates)", content: { "application/json": { schema: ref("UploadResult") } } },
            "400": errorResponse("Metadata or file refused (message names the field or file); when every file is refused the body also lists `files`"),
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("No write access to the project's group"),
            "404": errorResponse("Project not found"),
            "413": errorResponse("File, zip or request over a limit"),
            "415": errorResponse("Body is not multipart/form-data"),
            "503": errorResponse("Storage or database unreachable; nothing was stored for the file(s) concerned"),
          },
        },
      },
      "/api/v1/spectra/{id}": {
        get: {
          operationId: "getSpectrum",
          summary: "Status of a spectrum and its latest analysis",
          parameters: [idParam("Spectrum")],
          responses: {
            "200": { description: "The spectrum", content: { "application/json": { schema: ref("SpectrumStatus") } } },
            "401": errorResponse("No valid token or session"),
            "404": errorResponse("Not found or not readable by the caller"),
          },
        },
      },
      "/api/v1/spectra/{id}/raw": {
        get: {
          operationId: "getRawFile",
          summary: "The raw file exactly as uploaded (attachment with its original name)",
          parameters: [idParam("Spectrum")],
          responses: {
            "200": { description: "The bytes; header X-Bandkeep-Sha256 carries their sha256", content: { "application/octet-stream": { schema: { type: "string", contentMediaType: "application/octet-stream" } } } },
            "401": errorResponse("No valid token or session"),
            "404": errorResponse("Not found or not readable by the caller"),
          },
        },
      },
      "/api/v1/spectra/{id}/analyses": {
        post: {
          operationId: "requestAnalysis",
          summary: "Run the analysis again with changed parameters; earlier runs are kept",
          parameters: [idParam("Spectrum")],
          requestBody: { required: false, content: { "application/json": { schema: ref("AnalysisChanges") } } },
          responses: {
            "201": { description: "A new run was queued", content: { "application/json": { schema: ref("AnalysisRequest") } } },
            "200": { description: "A run with the same engine, parameters and reference exists (queued again if it had failed)", content: { "application/json": { schema: ref("AnalysisRequest") } } },
            "400": errorResponse("Invalid parameters"),
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("No write access"),
            "404": errorResponse("Spectrum not found"),
            "415": errorResponse("Body is not JSON"),
          },
        },
      },
      "/api/v1/series/{id}": {
        get: {
          operationId: "getSeries",
          summary: "Spectra of a series with their status and key numbers",
          parameters: [idParam("Series")],
          responses: {
            "200": { description: "The series", content: { "application/json": { schema: ref("SeriesStatus") } } },
            "401": errorResponse("No valid token or session"),
            "404": errorResponse("Not found or not readable by the caller"),
          },
        },
      },
      "/api/v1/projects": {
        get: {
          operationId: "listProjects",
          summary: "Projects the caller may upload to",
          responses: {
            "200": {
              description: "Projects",
              content: { "application/json": { schema: { type: "object", required: ["projects"], properties: { projects: { type: "array", items: ref("Project") } } } } },
            },
            "401": errorResponse("No valid token or session"),
          },
        },
      },
      "/api/v1/openapi.json": {
        get: { operationId: "getOpenApi", summary: "This document", responses: { "200": { description: "OpenAPI 3.1 document" } } },
      },
    },
    components: {
      securitySchemes: { bearer: { type: "http", scheme: "bearer", description: "API token from Settings → API tokens" } },
      schemas: {
        Error: {
          type: "object",
          required: ["error"],
          properties: {
            error: {
              type: "object",
              required: ["code", "message"],
              properties: { code: { type: "string" }, message: { type: "string" }, field: { type: "string" } },
            },
          },
        },
        UploadForm: {
          type: "object",
          required: ["file", "projectId", "technique"],
          properties: {
            file: { type: "array", items: { type: "string", contentMediaType: "application/octet-stream" }, description: "One or more exports (CSV/TSV/text or JCAMP-DX) or zips of them" },
            projectId: { type: "string", format: "uuid" },
            technique: { type: "string", enum: [...INGEST_TECHNIQUES] },
            sampleId: { type: "string", format: "uuid" },
            referenceSpectrumId: { type: "string", format: "uuid", description: "Parent (reference) spectrum compared against" },
            seriesId: { type: "string", format: "uuid" },
            seriesValue: { type: "number", description: "Value of the series variable for these files (needs seriesId)" },
            pathLengthCm: { type: "number", exclusiveMinimum: 0, maximum: 100 },
            excitationNm: { type: "number", exclusiveMinimum: 100, maximum: 3000 },
            solvent: { type: "string", maxLength: 100 },
            column: { type: "string", maxLength: 100, description: "Y column: header name, or zero-based index (0 is the X column)" },
            material: { type: "string", enum: [...INGEST_MATERIALS], description: "Core material for sizing; defaults from the sample" },
          },
        },
        UploadOutcome: {
          oneOf: [
            {
              type: "object",
              required: ["ok", "fileName", "spectrumId", "status", "duplicate", "queued", "sha256", "sizeBytes", "url"],
              properties: {
                ok: { const: true }, fileName: { type: "string" }, zip: { type: "string" }, spectrumId: { type: "string", format: "uuid" },
                runId: nullable("string", { format: "uuid" }), status: ref("SpectrumState"), duplicate: { type: "boolean" },
                queued: { type: "boolean" }, sha256: { type: "string" }, sizeBytes: { type: "integer" }, url: { type: "string" },
              },
            },
            {
              type: "object",
              required: ["ok", "fileName", "error"],
              properties: {
                ok: { const: false }, fileName: { type: "string" }, zip: { type: "string" },
                error: { type: "object", required: ["status", "code", "message"], properties: { status: { type: "integer" }, code: { type: "string" }, message: { type: "string" }, field: { type: "string" } } },
              },
            },
          ],
        },
        UploadResult: { type: "object", required: ["files"], properties: { files: { type: "array", items: ref("UploadOutcome") } } },
        SpectrumState: { type: "string", enum: ["received", "queued", "analysing", "analysed", "failed"] },
        Spectrum: {
          type: "object",
          properties: {
            id: { type: "string", format: "uuid" }, projectId: { type: "string", format: "uuid" }, sampleId: nullable("string"),
            seriesId: nullable("string"), seriesValue: nullable("number"), referenceSpectrumId: nullable("string"),
            technique: { type: "string", enum: [...INGEST_TECHNIQUES] }, fileName: { type: "string" }, sha256: { type: "string" },
            sizeBytes: { type: "integer" }, contentType: { type: "string" }, solvent: { type: "string" }, pathLengthCm: nullable("number"),
            excitationNm: nullable("number"), axisUnit: nullable("string"), valueUnit: nullable("string"), status: ref("SpectrumState"),
            error: nullable("string", { description: "Why the file could not be analysed (names file, line or column)" }),
            createdAt: { type: "string", format: "date-time" }, updatedAt: { type: "string", format: "date-time" }, rawUrl: { type: "string" },
          },
        },
        Analysis: {
          type: "object",
          properties: {
            runId: { type: "string", format: "uuid" }, status: { type: "string", enum: ["queued", "running", "done", "failed"] },
            engineVersion: { type: "string" }, parameterHash: { type: "string" }, parameters: { type: "object" },
            referenceSpectrumId: nullable("string"), error: nullable("string"), noise: nullable("number"),
            createdAt: { type: "string" }, startedAt: nullable("string"), finishedAt: nullable("string"), durationMs: nullable("integer"),
            peaks: {
              type: "array",
              items: {
                type: "object",
                properties: {
                  energyEv: { type: "number" }, wavelengthNm: { type: "number" }, height: { type: "number" }, fwhmMeV: nullable("number"),
                  area: nullable("number"), firstExciton: { type: "boolean" },
                },
              },
            },
            firstExciton: { type: ["object", "null"] },
            flags: {
              type: "array",
              items: {
                type: "object",
                properties: {
                  id: { type: "string" }, kind: { type: "string", enum: ["bleach", "new-band", "pl-quench", "shift", "broadening"] },
                  energyEv: nullable("number"), fraction: nullable("number"), shiftMeV: nullable("number"), significance: { type: "number" },
                  reviewState: { type: "string" }, message: nullable("string"),
                },
              },
            },
            derived: { type: ["object", "null"] },
            warnings: { type: "array", items: { type: "string" } },
          },
        },
        SpectrumStatus: {
          type: "object",
          required: ["spectrum", "analysis", "runs"],
          properties: {
            spectrum: ref("Spectrum"),
            analysis: { oneOf: [ref("Analysis"), { type: "null" }] },
            runs: { type: "array", items: { type: "object" } },
          },
        },
        SeriesStatus: {
          type: "object",
          properties: {
            series: { type: "object" },
            spectra: {
              type: "array",
              items: {
                type: "object",
                properties: {
                  id: { type: "string" }, fileName: { type: "string" }, technique: { type: "string" }, seriesValue: nullable("number"),
                  status: ref("SpectrumState"), error: nullable("string"), runId: nullable("string"), firstExciton: { type: ["object", "null"] },
                  bleachFraction: nullable("number"), quenchFraction: nullable("number"), shiftMeV: nullable("number"),
                  flagCount: { type: "integer" }, diameterNm: nullable("number"),
                },
              },
            },
          },
        },
        Project: {
          type: "object",
          properties: { id: { type: "string", format: "uuid" }, name: { type: "string" }, groupId: { type: "string" }, groupName: { type: "string" } },
        },
        AnalysisChanges: {
          type: "object",
          additionalProperties: false,
          description: "Members left out keep their earlier value; null clears one",
          properties: {
            column: { type: ["string", "integer", "null"] }, material: { type: ["string", "null"], enum: [...INGEST_MATERIALS, null] },
            pathLengthCm: nullable("number"), excitationNm: nullable("number"), smoothingWindow: nullable("integer"),
            smoothingPolynomial: nullable("integer"), baseline: { type: ["string", "null"], enum: ["none", "offset", "scatter", null] },
            thresholds: { type: "object" }, referenceSpectrumId: nullable("string", { format: "uuid" }),
          },
        },
        AnalysisRequest: {
          type: "object",
          properties: { runId: { type: "string" }, status: { type: "string" }, created: { type: "boolean" }, queued: { type: "boolean" } },
        },
      },
    },
  };
}
