// zod schemas built from the registries: the kind and technique enums and the thresholds object,
// for the API, the forms and the job payloads. Builders take the registry so tests can extend it.

import { z } from "zod";
import type { ThresholdSpec } from "./flagKinds";

/** An enum of a registry's keys whose error names every accepted value. */
export function registryEnum<K extends string>(field: string, keys: readonly [K, ...K[]]) {
  return z.enum(keys, { error: `${field} must be one of ${keys.join(", ")}` });
}

/** One threshold in (min, max], named in its messages. */
export function thresholdSchema(t: ThresholdSpec, label: string = t.name) {
  return z
    .number({ error: `${label} must be a number` })
    .gt(t.min, `${label} must be ${t.min === 0 ? "positive" : `greater than ${t.min}`}`)
    .max(t.max, `${label} must be at most ${t.max}`);
}

/** The `thresholds` object of the API: every member optional, unknown names refused. */
export function thresholdsSchemaOf<N extends string>(specs: readonly (ThresholdSpec & { name: N })[]) {
  const shape = Object.fromEntries(specs.map((t) => [t.name, thresholdSchema(t).optional()])) as Record<N, z.ZodOptional<z.ZodNumber>>;
  return z.object(shape).strict();
}
