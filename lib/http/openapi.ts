import { ENGINE_VERSION } from "@/lib/engine/version";
import { FLAG_KINDS, FLAG_UNITS, THRESHOLD_SPECS } from "@/lib/registry/flagKinds";
import { INGEST_MATERIALS, INGEST_TECHNIQUES } from "@/lib/ingest/metadata";
import { MAX_CONCENTRATION_RATIO, NORMALIZATION_WAVELENGTH_NM } from "@/lib/ingest/normalization";
import { X_UNIT_NAMES, Y_KIND_NAMES } from "@/lib/engine/parse/readChoice";
import { AUDIT_CATEGORIES } from "@/lib/auditTrail/eventKinds";

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const errorResponse = (description: string) => ({ description, content: { "application/json": { schema: ref("Error") } } });
const idParam = (what: string) => ({
  name: "id",
  in: "path",
  required: true,
  description: `${what} id (UUID)`,
  schema: { type: "string", format: "uuid" },
});
const nullable = (type: string, extra: Record<string, unknown> = {}) => ({ type: [type, "null"], ...extra });

const queryParam = (name: string, description: string, schema: Record<string, unknown>) => ({
  name,
  in: "query",
  required: false,
  description,
  schema,
});

/** A read-only GET: 200 with the given media type, the usual refusals, and any extra answers. */
function readOperation(
  operationId: string,
  summary: string,
  parameters: unknown[],
  mediaType: string,
  extra: Record<string, unknown> = {},
) {
  return {
    operationId,
    summary,
    parameters,
    responses: {
      "200": { description: "OK", content: { [mediaType]: {} } },
      "400": errorResponse("A query parameter is invalid (the message names it)"),
      "401": errorResponse("No valid token or session"),
      "404": errorResponse("Not found or not readable by the caller"),
      ...extra,
    },
  };
}

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
        get: readOperation(
          "searchSpectra",
          "Spectra the caller reads, newest first, narrowed by filters and band search; keyset pages (see docs/search.md)",
          [
            queryParam("q", "Text in file names, metadata, sample names and sample notes (case-insensitive; % and _ are literal)", {
              type: "string",
              maxLength: 100,
            }),
            queryParam("project", "Project id", { type: "string", format: "uuid" }),
            queryParam("sample", "Sample id", { type: "string", format: "uuid" }),
            queryParam("material", "Core material, e.g. CdSe (the spectrum's, else its sample's)", { type: "string" }),
            queryParam("technique", "Technique", { type: "string", enum: [...INGEST_TECHNIQUES] }),
            queryParam("uploader", "Id of the person who uploaded", { type: "string", format: "uuid" }),
            queryParam("from", "Stored on or after (YYYY-MM-DD)", { type: "string", format: "date" }),
            queryParam("to", "Stored on or before (YYYY-MM-DD)", { type: "string", format: "date" }),
            queryParam("status", "Spectrum state", { type: "string", enum: ["received", "queued", "analysing", "analysed", "failed"] }),
            queryParam("flag", "Has a flag of this kind in its latest analysis", { type: "string", enum: [...FLAG_KINDS] }),
            queryParam("flagMin", "Flag size at least, in the flag's unit (fraction, meV or signal); needs flag", {
              type: "number",
              minimum: 0,
            }),
            queryParam("flagSig", "Flag significance at least (σ); needs flag", { type: "number", minimum: 0 }),
            queryParam("review", "Has a flag in this review state", { type: "string", enum: ["awaiting", "confirmed", "dismissed"] }),
            queryParam("band", "Which band bandMin–bandMax applies to", { type: "string", enum: ["first-exciton", "emission", "band"] }),
            queryParam("bandMin", "Band range start (needs band)", { type: "number", exclusiveMinimum: 0 }),
            queryParam("bandMax", "Band range end (needs band)", { type: "number", exclusiveMinimum: 0 }),
            queryParam("bandUnit", "Unit of the band range (default nm)", { type: "string", enum: ["nm", "eV", "cm-1"] }),
            queryParam("sizeMin", "Diameter from the sizing curve at least (nm)", { type: "number", minimum: 0 }),
            queryParam("sizeMax", "Diameter from the sizing curve at most (nm)", { type: "number", minimum: 0 }),
            queryParam("after", "Cursor: the `next` of the previous page", { type: "string" }),
            queryParam("limit", "Rows per page (default 50)", { type: "integer", minimum: 1, maximum: 200 }),
          ],
          "application/json",
        ),
        post: {
          operationId: "uploadSpectra",
          summary: "Upload one or more exports (or zips of exports) with shared metadata",
          requestBody: {
            required: true,
            content: {
              "multipart/form-data": { schema: ref("UploadForm"), encoding: { file: { contentType: "application/octet-stream" } } },
            },
          },
          responses: {
            "201": {
              description: "At least one file was stored; one outcome per file",
              content: { "application/json": { schema: ref("UploadResult") } },
            },
            "200": {
              description: "Every file was already stored in the project (linked as duplicates)",
              content: { "application/json": { schema: ref("UploadResult") } },
            },
            "400": errorResponse(
              "Metadata or file refused (message names the field or file); when every file is refused the body also lists `files`",
            ),
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("No write access to the project's group"),
            "404": errorResponse("Project not found"),
            "413": errorResponse("File, zip or request over a limit"),
            "415": errorResponse("Body is not multipart/form-data"),
            "503": errorResponse("Storage or database unreachable; nothing was stored for the file(s) concerned"),
          },
        },
      },
      "/api/v1/spectra/preview": {
        post: {
          operationId: "previewSpectrumFile",
          summary:
            "Read one file as an upload would, without storing it: encoding, layout, units (and where they came from), columns, a thinned curve, what would be created",
          requestBody: {
            required: true,
            content: {
              "multipart/form-data": {
                schema: {
                  type: "object",
                  required: ["file", "projectId"],
                  properties: {
                    file: { type: "string", contentMediaType: "application/octet-stream" },
                    projectId: {
                      type: "string",
                      format: "uuid",
                      description: "The project the file is meant for (same access as an upload)",
                    },
                    technique: { type: "string", enum: [...INGEST_TECHNIQUES] },
                    column: { type: "string", maxLength: 100 },
                    xUnit: { type: "string", enum: [...X_UNIT_NAMES] },
                    yKind: { type: "string", enum: [...Y_KIND_NAMES] },
                    block: { type: "integer", minimum: 1 },
                    pair: { type: "integer", minimum: 1 },
                    sheet: { type: "string", maxLength: 100 },
                    excitationNm: { type: "number", exclusiveMinimum: 100, maximum: 3000 },
                    split: { type: "string", enum: ["all"] },
                    profile: { type: "string", maxLength: 80 },
                  },
                },
              },
            },
          },
          responses: {
            "200": {
              description:
                "`{ok: true, encoding, layout, xUnit, xUnitSource, yKind, column, traces, plot, bands, split, profile, signature, creates, ...}` or `{ok: false, error}` for a file that cannot be read (the engine's one-line message)",
              content: { "application/json": { schema: { type: "object" } } },
            },
            "400": errorResponse("A field refused (the message names it), or no file"),
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("No write access to the project's group"),
            "404": errorResponse("Project not found"),
            "413": errorResponse("Over the size limit for one file"),
            "415": errorResponse("Body is not multipart/form-data"),
          },
        },
      },
      "/api/v1/projects/{id}/import-profiles": {
        get: {
          operationId: "listImportProfiles",
          summary: "The project's import profiles (for people who may upload to it)",
          parameters: [idParam("Project")],
          responses: {
            "200": {
              description: "Profiles",
              content: {
                "application/json": {
                  schema: { type: "object", properties: { profiles: { type: "array", items: ref("ImportProfile") } } },
                },
              },
            },
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("No write access to the project's group"),
            "404": errorResponse("Project not found"),
          },
        },
        post: {
          operationId: "saveImportProfile",
          summary: "Save a named import profile; saving a name again replaces it",
          parameters: [idParam("Project")],
          requestBody: {
            required: true,
            content: {
              "application/json": {
                schema: {
                  type: "object",
                  required: ["name", "choice", "signature"],
                  properties: {
                    name: { type: "string", maxLength: 80 },
                    choice: ref("ImportProfileChoice"),
                    signature: { type: "string", maxLength: 2000 },
                  },
                },
              },
            },
          },
          responses: {
            "201": {
              description: "Created",
              content: { "application/json": { schema: { type: "object", properties: { profile: ref("ImportProfile") } } } },
            },
            "200": {
              description: "Replaced",
              content: { "application/json": { schema: { type: "object", properties: { profile: ref("ImportProfile") } } } },
            },
            "400": errorResponse("A field refused (the message names it)"),
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("No write access to the project's group"),
            "404": errorResponse("Project not found"),
            "415": errorResponse("Body is not JSON"),
          },
        },
      },
      "/api/v1/projects/{id}/import-profiles/{profileId}": {
        delete: {
          operationId: "deleteImportProfile",
          summary: "Delete an import profile (spectra read with it are not touched)",
          parameters: [
            idParam("Project"),
            { name: "profileId", in: "path", required: true, description: "Profile id (UUID)", schema: { type: "string", format: "uuid" } },
          ],
          responses: {
            "204": { description: "Deleted" },
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("No write access to the project's group"),
            "404": errorResponse("Project or profile not found"),
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
            "200": {
              description: "The bytes; header X-Bandkeep-Sha256 carries their sha256",
              content: { "application/octet-stream": { schema: { type: "string", contentMediaType: "application/octet-stream" } } },
            },
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
            "200": {
              description: "A run with the same engine, parameters and reference exists (queued again if it had failed)",
              content: { "application/json": { schema: ref("AnalysisRequest") } },
            },
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
              content: {
                "application/json": {
                  schema: { type: "object", required: ["projects"], properties: { projects: { type: "array", items: ref("Project") } } },
                },
              },
            },
            "401": errorResponse("No valid token or session"),
          },
        },
      },
      "/api/v1/openapi.json": {
        get: { operationId: "getOpenApi", summary: "This document", responses: { "200": { description: "OpenAPI 3.1 document" } } },
      },
      "/api/v1/spectra/{id}/data": {
        get: readOperation(
          "getSpectrumCurves",
          "Curves of the latest (or named) analysis as columnar arrays {x, series: {raw, smoothed, reference, difference}}",
          [
            idParam("Spectrum"),
            queryParam("axis", "Display axis", { type: "string", enum: ["nm", "ev", "cm-1"] }),
            queryParam("run", "An earlier analysis run", { type: "string", format: "uuid" }),
            queryParam("format", "json (default) or binary: the columns format, application/vnd.bandkeep.columns (docs/api.md)", {
              type: "string",
              enum: ["json", "binary"],
            }),
          ],
          "application/json",
          { "409": errorResponse("Not analysed yet"), "422": errorResponse("The file or its analysis failed") },
        ),
      },
      "/api/v1/spectra/{id}/export": {
        get: readOperation(
          "exportSpectrum",
          "Processed curves as CSV, one curve as JCAMP-DX 4.24, or the stored analysis report as JSON",
          [
            idParam("Spectrum"),
            queryParam("format", "File format", { type: "string", enum: ["csv", "jcamp", "json"] }),
            queryParam("axis", "Axis of the CSV or JCAMP-DX file", { type: "string", enum: ["nm", "ev", "cm-1"] }),
            queryParam("run", "An earlier analysis run", { type: "string", format: "uuid" }),
          ],
          "application/octet-stream",
          { "409": errorResponse("Not analysed yet"), "422": errorResponse("The file or its analysis failed") },
        ),
      },
      "/api/v1/series/{id}/export": {
        get: readOperation("exportSeries", "The series table and its fits as CSV", [idParam("Series")], "text/csv"),
      },
      "/api/v1/series/{id}/supernatants": {
        get: {
          ...readOperation(
            "readSupernatants",
            "Each point of the series with its linked supernatant spectrum's measured absorbance at the two wavelengths of a depletion analysis",
            [
              idParam("Series"),
              {
                ...queryParam("nmA", "Wavelength at which dot A is read, nm (its first exciton, or 400 nm for PbS/PbSe)", {
                  type: "number",
                  minimum: 200,
                  maximum: 3000,
                }),
                required: true,
              },
              {
                ...queryParam("nmX", "Wavelength at which dot X is read, nm", { type: "number", minimum: 200, maximum: 3000 }),
                required: true,
              },
              queryParam("pureA", "A spectrum of pure dot A, also read at both wavelengths (for the overlap)", {
                type: "string",
                format: "uuid",
              }),
              queryParam("pureX", "A spectrum of pure dot X, also read at both wavelengths", { type: "string", format: "uuid" }),
            ],
            "application/json",
          ),
        },
        post: {
          operationId: "linkSupernatant",
          summary:
            "Link an absorption spectrum of the same project as the supernatant of one point of the series, or unlink it (pointSpectrumId null)",
          parameters: [idParam("Series")],
          requestBody: { required: true, content: { "application/json": { schema: ref("SupernatantLink") } } },
          responses: {
            "200": {
              description: "The link as it now stands; `changed` is false when nothing had to change",
              content: { "application/json": { schema: ref("SupernatantLinkOutcome") } },
            },
            "400": errorResponse(
              "Invalid body, or the spectrum cannot be a supernatant (not absorption, or itself a series point); the message names the field",
            ),
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("The caller may read the series but not add data to its group"),
            "404": errorResponse("Series, supernatant or point not found (or not readable by the caller)"),
            "409": errorResponse("The point already has a supernatant, or the supernatant belongs to a point of another series"),
            "415": errorResponse("Body is not JSON"),
          },
        },
      },
      "/api/v1/review/queue": {
        get: readOperation(
          "listReviewQueue",
          "Signatures in the groups the caller leads, filtered, sorted and paged by keyset (see docs/api.md)",
          [
            queryParam("project", "Project id", { type: "string", format: "uuid" }),
            queryParam("sample", "Sample id", { type: "string", format: "uuid" }),
            queryParam("kind", "Kind of change", { type: "string", enum: [...FLAG_KINDS] }),
            queryParam("state", "Review state", { type: "string", enum: ["awaiting", "confirmed", "dismissed", "all"] }),
            queryParam("minSignificance", "Smallest significance (σ)", { type: "number" }),
            queryParam("from", "Flagged on or after (YYYY-MM-DD)", { type: "string", format: "date" }),
            queryParam("to", "Flagged on or before (YYYY-MM-DD)", { type: "string", format: "date" }),
            queryParam("sort", "Sort column", { type: "string", enum: ["significance", "date", "kind", "project", "sample"] }),
            queryParam("dir", "Sort direction", { type: "string", enum: ["asc", "desc"] }),
            queryParam("after", "Cursor of the next page (the answer's next); keyset paging, no page numbers", { type: "string" }),
            queryParam("pageSize", "Rows per page", { type: "integer", minimum: 1, maximum: 200 }),
          ],
          "application/json",
          { "403": errorResponse("The caller leads no group") },
        ),
      },
      "/api/v1/signatures/{id}/decisions": {
        get: readOperation(
          "getDecisions",
          "A signature's review state and the history of decisions",
          [idParam("Signature")],
          "application/json",
        ),
        post: {
          operationId: "decide",
          summary:
            "Confirm or dismiss a signature with a comment (group leads); deciding again revises, history is kept; {undo} takes back the latest decision",
          parameters: [idParam("Signature")],
          requestBody: {
            required: true,
            content: {
              "application/json": {
                schema: {
                  oneOf: [
                    {
                      type: "object",
                      required: ["decision"],
                      properties: {
                        decision: { type: "string", enum: ["confirmed", "dismissed"] },
                        comment: { type: "string", maxLength: 2000 },
                      },
                    },
                    {
                      type: "object",
                      required: ["undo"],
                      properties: { undo: { type: "string", format: "uuid", description: "Id of the latest decision in the history" } },
                    },
                  ],
                },
              },
            },
          },
          responses: {
            "200": { description: "The decision equals the current state: nothing recorded (unchanged: true)" },
            "201": { description: "Decision or undo recorded" },
            "409": errorResponse("The flag was replaced by a newer run, or the decision to undo is not the latest"),
            "400": errorResponse("Invalid decision or comment"),
            "401": errorResponse("No valid token or session"),
            "403": errorResponse("Not a lead of the owning group"),
            "404": errorResponse("Not found or not readable by the caller"),
          },
        },
      },
      "/api/v1/audit": {
        get: readOperation(
          "exportAudit",
          "The audit trail of the groups the caller stewards, newest first: JSON one page at a time (next is the cursor of the following page), CSV the whole selection with raw codes and full details",
          [
            queryParam("format", "csv or json", { type: "string", enum: ["csv", "json"] }),
            queryParam("category", "sign-in, upload, analysis, decision, sharing, retention or holds", {
              type: "string",
              enum: [...AUDIT_CATEGORIES],
            }),
            queryParam("person", "A person's id (their events in the caller's groups)", { type: "string", format: "uuid" }),
            queryParam("action", "One raw event code", { type: "string" }),
            queryParam("from", "On or after (YYYY-MM-DD)", { type: "string", format: "date" }),
            queryParam("to", "On or before (YYYY-MM-DD)", { type: "string", format: "date" }),
            queryParam("after", "Cursor from the previous JSON page's next", { type: "string" }),
            queryParam("limit", "JSON page size, 1 to 1000 (default 50)", { type: "integer", minimum: 1, maximum: 1000 }),
          ],
          "text/csv",
          { "400": errorResponse("A filter is not valid (the field is named)"), "403": errorResponse("The caller stewards no group") },
        ),
      },
      "/api/v1/exports/{type}/{id}": {
        get: readOperation(
          "exportBundle",
          "A project or series as one zip: raw files, processed CSV and JCAMP-DX, analyses as JSON, a manifest with sha256, a README",
          [
            { name: "type", in: "path", required: true, schema: { type: "string", enum: ["project", "series"] } },
            idParam("Project or series"),
          ],
          "application/zip",
        ),
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
            file: {
              type: "array",
              items: { type: "string", contentMediaType: "application/octet-stream" },
              description: "One or more exports (CSV/TSV/text in UTF-8, UTF-16 or a single-byte encoding, JCAMP-DX, .xlsx) or zips of them",
            },
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
            xUnit: {
              type: "string",
              enum: [...X_UNIT_NAMES],
              description: "X unit, for files whose header does not state it (or to override it); docs/ingest.md says when it is inferred",
            },
            yKind: { type: "string", enum: [...Y_KIND_NAMES], description: "What the Y values are, when the file does not say" },
            block: {
              type: "integer",
              minimum: 1,
              description: "Block to read when the file holds several blocks one after another (default 1)",
            },
            pair: { type: "integer", minimum: 1, description: "X,Y pair to read when the file holds pairs side by side" },
            sheet: {
              type: "string",
              maxLength: 100,
              description: "Spreadsheet (.xlsx) sheet: name or 1-based number; default the first sheet with a numeric table",
            },
            split: {
              type: "string",
              enum: ["all"],
              description:
                'One spectrum per Y column, pair or block of the file (the raw file is stored once); a header such as "0.5 eq" gives the trace\'s series value',
            },
            assignments: {
              type: "string",
              contentMediaType: "application/json",
              description:
                "With split: a JSON array of {trace (a label from the preview's traces), sampleId?, seriesValue?, skip?} giving traces their own sample or value, or leaving them out",
            },
            profile: {
              type: "string",
              maxLength: 80,
              description:
                'An import profile of the project by name, or "none"; empty: the profile whose header signature matches the file, if any (docs/ingest.md)',
            },
            onDuplicate: {
              type: "string",
              enum: ["keep", "update"],
              description:
                "Bytes (and trace) already stored with other details: keep the stored details (default; the outcome lists differences) or update them (audited; re-analysed when an analysis input changed)",
            },
          },
        },
        ImportProfile: {
          type: "object",
          required: ["id", "name", "choice", "signature", "updatedAt"],
          properties: {
            id: { type: "string", format: "uuid" },
            name: { type: "string", maxLength: 80 },
            choice: ref("ImportProfileChoice"),
            signature: { type: "string", description: "Header signature the profile matches (the preview's `signature`)" },
            updatedAt: { type: "string", format: "date-time" },
          },
        },
        ImportProfileChoice: {
          type: "object",
          additionalProperties: false,
          properties: {
            column: { type: "string", maxLength: 100 },
            xUnit: { type: "string", enum: [...X_UNIT_NAMES] },
            yKind: { type: "string", enum: [...Y_KIND_NAMES] },
            block: { type: "integer", minimum: 1 },
            pair: { type: "integer", minimum: 1 },
            sheet: { type: "string", maxLength: 100 },
            split: { const: true },
          },
        },
        UploadOutcome: {
          oneOf: [
            {
              type: "object",
              required: ["ok", "fileName", "spectrumId", "status", "duplicate", "queued", "sha256", "sizeBytes", "url"],
              properties: {
                ok: { const: true },
                fileName: { type: "string" },
                zip: { type: "string" },
                spectrumId: { type: "string", format: "uuid" },
                runId: nullable("string", { format: "uuid" }),
                status: ref("SpectrumState"),
                duplicate: { type: "boolean" },
                queued: { type: "boolean" },
                sha256: { type: "string" },
                sizeBytes: { type: "integer" },
                url: { type: "string" },
                differences: {
                  type: "array",
                  description: "For a duplicate: details sent that differ from the stored ones; the stored ones were kept",
                  items: {
                    type: "object",
                    properties: {
                      field: { type: "string" },
                      label: { type: "string" },
                      stored: nullable("string"),
                      sent: { type: "string" },
                    },
                  },
                },
                updated: {
                  type: "object",
                  description:
                    "With onDuplicate=update: the details replaced, and the new analysis run when one of them enters the analysis",
                  properties: { fields: { type: "array", items: { type: "string" } }, reanalysis: nullable("object") },
                },
                trace: { type: "string", description: "With split: the label of the trace this spectrum reads" },
                seriesValue: nullable("number", { description: "With split: the trace's series value (from its header or assignments)" }),
                seriesUnit: { type: "string", description: "With split: the unit written in the trace's header" },
                profile: { type: "object", properties: { name: { type: "string" }, how: { type: "string", enum: ["named", "matched"] } } },
              },
            },
            {
              type: "object",
              required: ["ok", "fileName", "error"],
              properties: {
                ok: { const: false },
                fileName: { type: "string" },
                zip: { type: "string" },
                error: {
                  type: "object",
                  required: ["status", "code", "message"],
                  properties: {
                    status: { type: "integer" },
                    code: { type: "string" },
                    message: { type: "string" },
                    field: { type: "string" },
                  },
                },
              },
            },
          ],
        },
        UploadResult: { type: "object", required: ["files"], properties: { files: { type: "array", items: ref("UploadOutcome") } } },
        SpectrumState: { type: "string", enum: ["received", "queued", "analysing", "analysed", "failed"] },
        Spectrum: {
          type: "object",
          properties: {
            id: { type: "string", format: "uuid" },
            projectId: { type: "string", format: "uuid" },
            sampleId: nullable("string"),
            seriesId: nullable("string"),
            seriesValue: nullable("number"),
            referenceSpectrumId: nullable("string"),
            technique: { type: "string", enum: [...INGEST_TECHNIQUES] },
            fileName: { type: "string" },
            sha256: { type: "string" },
            sizeBytes: { type: "integer" },
            contentType: { type: "string" },
            solvent: { type: "string" },
            pathLengthCm: nullable("number"),
            excitationNm: nullable("number"),
            axisUnit: nullable("string"),
            valueUnit: nullable("string"),
            status: ref("SpectrumState"),
            error: nullable("string", { description: "Why the file could not be analysed (names file, line or column)" }),
            createdAt: { type: "string", format: "date-time" },
            updatedAt: { type: "string", format: "date-time" },
            rawUrl: { type: "string" },
          },
        },
        Analysis: {
          type: "object",
          properties: {
            runId: { type: "string", format: "uuid" },
            status: { type: "string", enum: ["queued", "running", "done", "failed"] },
            engineVersion: { type: "string" },
            parameterHash: { type: "string" },
            parameters: { type: "object" },
            referenceSpectrumId: nullable("string"),
            error: nullable("string"),
            noise: nullable("number"),
            createdAt: { type: "string" },
            startedAt: nullable("string"),
            finishedAt: nullable("string"),
            durationMs: nullable("integer"),
            peaks: {
              type: "array",
              items: {
                type: "object",
                properties: {
                  energyEv: { type: "number" },
                  wavelengthNm: { type: "number" },
                  height: { type: "number" },
                  fwhmMeV: nullable("number"),
                  area: nullable("number"),
                  firstExciton: { type: "boolean" },
                },
              },
            },
            firstExciton: { type: ["object", "null"] },
            flags: {
              type: "array",
              items: {
                type: "object",
                properties: {
                  id: { type: "string" },
                  kind: { type: "string", enum: [...FLAG_KINDS] },
                  energyEv: nullable("number"),
                  fraction: nullable("number"),
                  shiftMeV: nullable("number"),
                  magnitude: nullable("number", { description: "the flag's size in its unit" }),
                  unit: { type: ["string", "null"], enum: [...FLAG_UNITS, null] },
                  uncertainty: nullable("number", { description: "standard uncertainty of magnitude" }),
                  significance: { type: "number" },
                  reviewState: { type: "string" },
                  message: nullable("string"),
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
                  id: { type: "string" },
                  fileName: { type: "string" },
                  technique: { type: "string" },
                  seriesValue: nullable("number"),
                  status: ref("SpectrumState"),
                  error: nullable("string"),
                  runId: nullable("string"),
                  firstExciton: { type: ["object", "null"] },
                  bleachFraction: nullable("number"),
                  quenchFraction: nullable("number"),
                  shiftMeV: nullable("number"),
                  flagCount: { type: "integer" },
                  diameterNm: nullable("number"),
                },
              },
            },
          },
        },
        SupernatantLink: {
          type: "object",
          required: ["supernatantSpectrumId", "pointSpectrumId"],
          properties: {
            supernatantSpectrumId: { type: "string", format: "uuid" },
            pointSpectrumId: nullable("string", { format: "uuid", description: "A spectrum of this series; null unlinks" }),
          },
        },
        SupernatantLinkOutcome: {
          type: "object",
          properties: {
            supernatantSpectrumId: { type: "string" },
            pointSpectrumId: nullable("string"),
            previousPointSpectrumId: nullable("string"),
            changed: { type: "boolean" },
          },
        },
        Project: {
          type: "object",
          properties: {
            id: { type: "string", format: "uuid" },
            name: { type: "string" },
            groupId: { type: "string" },
            groupName: { type: "string" },
          },
        },
        AnalysisChanges: {
          type: "object",
          additionalProperties: false,
          description: "Members left out keep their earlier value; null clears one",
          properties: {
            column: { type: ["string", "integer", "null"] },
            material: { type: ["string", "null"], enum: [...INGEST_MATERIALS, null] },
            xUnit: { type: ["string", "null"], enum: [...X_UNIT_NAMES, null] },
            yKind: { type: ["string", "null"], enum: [...Y_KIND_NAMES, null] },
            block: nullable("integer"),
            pair: nullable("integer"),
            sheet: nullable("string"),
            pathLengthCm: nullable("number"),
            excitationNm: nullable("number"),
            smoothingWindow: nullable("integer"),
            smoothingPolynomial: nullable("integer"),
            baseline: { type: ["string", "null"], enum: ["none", "offset", "scatter", null] },
            thresholds: {
              type: "object",
              additionalProperties: false,
              properties: Object.fromEntries(
                THRESHOLD_SPECS.map((t) => [
                  t.name,
                  { type: "number", exclusiveMinimum: t.min, maximum: t.max, default: t.default, description: t.label },
                ]),
              ),
            },
            normalization: { oneOf: [ref("Normalization"), { type: "null" }] },
            referenceSpectrumId: nullable("string", { format: "uuid" }),
          },
        },
        Normalization: {
          description:
            "How the sample is scaled against its parent reference before the difference (needs a reference). " +
            "The factor used is in the report at parameters.normalization.factor, the reason at parameters.normalization.details.reason. " +
            "Mode auto (the default) fits a concentration ratio and a smooth background on band-free regions; it clears a stored choice, like null.",
          oneOf: [
            { type: "object", additionalProperties: false, required: ["mode"], properties: { mode: { const: "auto" } } },
            { type: "object", additionalProperties: false, required: ["mode"], properties: { mode: { const: "none" } } },
            {
              type: "object",
              additionalProperties: false,
              required: ["mode", "wavelengthNm"],
              description: "Sample scaled to equal the reference at this wavelength",
              properties: {
                mode: { const: "wavelength" },
                wavelengthNm: { type: "number", minimum: NORMALIZATION_WAVELENGTH_NM.min, maximum: NORMALIZATION_WAVELENGTH_NM.max },
              },
            },
            {
              type: "object",
              additionalProperties: false,
              required: ["mode", "sampleConcentration", "referenceConcentration"],
              description: `Sample multiplied by referenceConcentration / sampleConcentration (same unit for both; within a factor of ${MAX_CONCENTRATION_RATIO})`,
              properties: {
                mode: { const: "concentration" },
                sampleConcentration: { type: "number", exclusiveMinimum: 0 },
                referenceConcentration: { type: "number", exclusiveMinimum: 0 },
              },
            },
          ],
        },
        AnalysisRequest: {
          type: "object",
          properties: { runId: { type: "string" }, status: { type: "string" }, created: { type: "boolean" }, queued: { type: "boolean" } },
        },
      },
    },
  };
}
