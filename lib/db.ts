import pg from "pg";
import { QueryTypes, Sequelize } from "sequelize";
import { config } from "./config";

// The one Sequelize instance of a process. Created lazily so that importing a model
// does not need a database until it is used.
const globalForDb = globalThis as unknown as { bandkeepSequelize?: Sequelize };

export function sequelize(): Sequelize {
  if (!globalForDb.bandkeepSequelize) {
    globalForDb.bandkeepSequelize = new Sequelize(config().DATABASE_URL, {
      dialect: "postgres",
      dialectModule: pg,
      logging: false,
      pool: { max: Number(process.env.DB_POOL_MAX ?? 10), min: 0, idle: 10_000 },
      define: { underscored: true },
    });
  }
  return globalForDb.bandkeepSequelize;
}

export async function closeDb(): Promise<void> {
  if (globalForDb.bandkeepSequelize) {
    await globalForDb.bandkeepSequelize.close();
    globalForDb.bandkeepSequelize = undefined;
  }
}

/** Runs a read-only SQL query with named replacements and returns its rows. */
export async function selectRows<T extends object>(sql: string, replacements: Record<string, unknown> = {}): Promise<T[]> {
  return sequelize().query<T>(sql, { replacements, type: QueryTypes.SELECT });
}
