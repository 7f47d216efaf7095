// A sweep in its own process, for the kill test: node --import tsx this-file PROJECT_ID PAUSE_MS
import { runSweep } from "@/lib/stewardship/sweep";

const [projectId, pause] = process.argv.slice(2);
await runSweep({
  projectIds: [projectId!],
  pauseMs: Number(pause),
  onItem: (kind, id) => console.log(`item ${kind} ${id}`),
});
console.log("sweep finished");
process.exit(0);
