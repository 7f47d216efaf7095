// Pure builders that turn a registry (one spec per key) into the lists and maps the app uses.
// The app calls them with the real registries; tests call them with a registry extended by a
// fake entry to show that everything follows (tests/unit/registry-extension.test.ts).

import type { KindSpec, ThresholdSpec } from "./flagKinds";

export type KeyOf<S> = Extract<keyof S, string>;
export type ThresholdNameOf<G extends Record<string, ThresholdSpec>, S extends Record<string, KindSpec>> =
  KeyOf<G> | S[KeyOf<S>]["threshold"]["name"];

/** The registry's keys in its order, as a non-empty tuple (zod's enum wants one). */
export function keysOf<S extends object>(specs: S): [KeyOf<S>, ...KeyOf<S>[]] {
  const keys = Object.keys(specs) as KeyOf<S>[];
  if (keys.length === 0) throw new RangeError("a registry needs at least one entry");
  return keys as [KeyOf<S>, ...KeyOf<S>[]];
}

/** One field of every spec, keyed by the registry's keys. */
export function mapOf<S extends object, F extends keyof S[KeyOf<S>]>(specs: S, field: F): Record<KeyOf<S>, S[KeyOf<S>][F]> {
  return Object.fromEntries(keysOf(specs).map((k) => [k, specs[k][field]])) as Record<KeyOf<S>, S[KeyOf<S>][F]>;
}

/** Every threshold: the general ones first, then one per kind, in registry order. Names must be unique. */
export function thresholdSpecsOf<G extends Record<string, ThresholdSpec>, S extends Record<string, KindSpec>>(
  general: G,
  kinds: S,
): (ThresholdSpec & { name: ThresholdNameOf<G, S> })[] {
  const all = [...Object.values(general), ...keysOf(kinds).map((k) => kinds[k].threshold)];
  const seen = new Set<string>();
  for (const t of all) {
    if (seen.has(t.name)) throw new RangeError(`threshold ${t.name} is named twice in the flag-kind registry`);
    seen.add(t.name);
  }
  return all as (ThresholdSpec & { name: ThresholdNameOf<G, S> })[];
}

export function thresholdDefaultsOf<N extends string>(specs: readonly (ThresholdSpec & { name: N })[]): Record<N, number> {
  return Object.fromEntries(specs.map((t) => [t.name, t.default])) as Record<N, number>;
}

export type ThresholdField<N extends string = string> = { name: N; label: string; hint: string; min: number; max: number };

/** The re-run form's threshold fields: name, label, a hint with the default, and the accepted range. */
export function thresholdFieldsOf<N extends string>(specs: readonly (ThresholdSpec & { name: N })[]): ThresholdField<N>[] {
  return specs.map((t) => ({
    name: t.name,
    label: t.label,
    hint: `default ${t.unit === "fraction" ? t.default.toFixed(2) : String(t.default)}`,
    min: t.min,
    max: t.max,
  }));
}
