/**
 * Process-wide values (service clients, caches) kept on globalThis under a name, so that every copy
 * of a module in one process shares them: Next.js may bundle a route handler and a server action
 * as separate module copies, and dev reloads re-run modules.
 */
type Slots = Record<string, unknown>;
const slots = globalThis as unknown as Slots;

/** The value under `name`, created by `create` the first time any module copy asks. */
export function processSingleton<T>(name: string, create: () => T): T {
  if (slots[name] === undefined) slots[name] = create();
  return slots[name] as T;
}

/** A named slot for a value that is set and cleared explicitly (a connection closed on shutdown, a flag). */
export function processSlot<T>(name: string): { get(): T | undefined; set(value: T | undefined): void } {
  return {
    get: () => slots[name] as T | undefined,
    set: (value) => {
      slots[name] = value;
    },
  };
}
