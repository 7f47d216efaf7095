// Runs the health route's handler in a plain process with the environment it was given,
// and prints its status and body as one JSON line.
import { GET } from "../../app/api/health/route";
import { closeDb } from "../../lib/db";

const response = await GET();
const body = (await response.json()) as { services: unknown };
console.log(JSON.stringify({ httpStatus: response.status, services: body.services }));
await closeDb();
process.exit(0);
