// npm run migrate | npm run migrate:down [-- --to NAME|0]
import { migrator } from "../lib/migrator";
import { closeDb } from "../lib/db";

const [direction = "up", flag, target] = process.argv.slice(2);
const umzug = migrator();
try {
  if (direction === "up") {
    const done = await umzug.up();
    console.log(done.length ? `migrated: ${done.map((m) => m.name).join(", ")}` : "schema is up to date");
  } else if (direction === "down") {
    const to = flag === "--to" ? (target === "0" ? 0 : target) : undefined;
    const undone = await umzug.down(to === undefined ? undefined : { to: to as never });
    console.log(`reverted: ${undone.map((m) => m.name).join(", ") || "nothing"}`);
  } else {
    throw new Error(`unknown direction "${direction}": use up or down`);
  }
} catch (error) {
  console.error(`migration failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
