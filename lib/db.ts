import pg from "pg";
import { QueryTypes, Sequelize } from "sequelize";
import { config } from "./config";

// The one Sequelize instance of a process. Created lazily so that importing a model
// does not need a database until it is used.
const globalForDb = globalThis as unknown as { bandkeepSequelize?: Sequelize; bandkeepMigrationSequelize?: Sequelize };

const connect = (url: string, poolMax: number) =>
  new Sequelize(url, {
    dialect: "postgres",
    dialectModule: pg,
    logging: false,
    pool: { max: poolMax, min: 0, idle: 10_000 },
    define: { underscored: true },
  });

/** The app's connection, as the least-privilege app role (DATABASE_URL). */
export function sequelize(): Sequelize {
  globalForDb.bandkeepSequelize ??= connect(config().DATABASE_URL, Number(process.env.DB_POOL_MAX ?? 10));
  return globalForDb.bandkeepSequelize;
}

/** The migrations' connection, as the schema owner (MIGRATION_DATABASE_URL, else DATABASE_URL for a one-role set-up). */
export function migrationSequelize(): Sequelize {
  globalForDb.bandkeepMigrationSequelize ??= connect(config().MIGRATION_DATABASE_URL ?? config().DATABASE_URL, 2);
  return globalForDb.bandkeepMigrationSequelize;
}

export async function closeDb(): Promise<void> {
  const open = [globalForDb.bandkeepSequelize, globalForDb.bandkeepMigrationSequelize];
  globalForDb.bandkeepSequelize = undefined;
  globalForDb.bandkeepMigrationSequelize = undefined;
  await Promise.all(open.map((db) => db?.close()));
}

/** Runs a read-only SQL query with named replacements and returns its rows. */
export async function selectRows<T extends object>(sql: string, replacements: Record<string, unknown> = {}): Promise<T[]> {
  return sequelize().query<T>(sql, { replacements, type: QueryTypes.SELECT });
}
