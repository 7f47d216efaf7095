import v8 from "node:v8";
import vm from "node:vm";

/**
 * Keeps the worker's resident memory low without start-up flags (the start command is plain
 * `node --import tsx workers/index.ts`): V8 grows its heap lazily under a steady job load, so
 * after a job, when the heap has grown past `heapLimitMb`, a full collection is run. Costs a
 * few tens of milliseconds, rarely.
 */
export function memoryGuard(heapLimitMb: number): () => void {
  v8.setFlagsFromString("--expose-gc");
  const gc = vm.runInNewContext("gc") as (() => void) | undefined;
  let lastRun = 0;
  return () => {
    if (!gc) return;
    const { heapUsed } = process.memoryUsage();
    if (heapUsed > heapLimitMb * 1024 * 1024 && Date.now() - lastRun > 1000) {
      lastRun = Date.now();
      gc();
    }
  };
}
