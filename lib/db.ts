import pg from "pg";
import { QueryTypes, Sequelize } from "sequelize";
import { databaseConfig } from "./config";
import { processSlot } from "./processSingleton";

// The one Sequelize instance of a process. Created lazily so that importing a model
// does not need a database until it is used.
const appDb = processSlot<Sequelize>("bandkeepSequelize");
const migrationDb = processSlot<Sequelize>("bandkeepMigrationSequelize");

const connect = (url: string, poolMax: number) =>
  new Sequelize(url, {
    dialect: "postgres",
    dialectModule: pg,
    logging: false,
    pool: { max: poolMax, min: 0, idle: 10_000 },
    define: { underscored: true },
    // No JIT compilation: the app's queries are short, and at 10⁵ rows compiling a plan took
    // 200 ms of a 280 ms scan (docs/benchmarks.md); PostgreSQL's own guidance is to use JIT for
    // long analytical queries.
    dialectOptions: { options: "-c jit=off" },
  });

/** The app's connection, as the least-privilege app role (DATABASE_URL). */
export function sequelize(): Sequelize {
  const open = appDb.get() ?? connect(databaseConfig().DATABASE_URL, Number(process.env.DB_POOL_MAX ?? 10));
  appDb.set(open);
  return open;
}

/** The migrations' connection, as the schema owner (MIGRATION_DATABASE_URL, else DATABASE_URL for a one-role set-up). */
export function migrationSequelize(): Sequelize {
  const open = migrationDb.get() ?? connect(databaseConfig().MIGRATION_DATABASE_URL ?? databaseConfig().DATABASE_URL, 2);
  migrationDb.set(open);
  return open;
}

export async function closeDb(): Promise<void> {
  const open = [appDb.get(), migrationDb.get()];
  appDb.set(undefined);
  migrationDb.set(undefined);
  await Promise.all(open.map((db) => db?.close()));
}

/** Runs a read-only SQL query with named replacements and returns its rows. */
export async function selectRows<T extends object>(sql: string, replacements: Record<string, unknown> = {}): Promise<T[]> {
  return sequelize().query<T>(sql, { replacements, type: QueryTypes.SELECT });
}
