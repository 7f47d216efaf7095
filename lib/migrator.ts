import { readdirSync } from "node:fs";
import { join, basename } from "node:path";
import { pathToFileURL } from "node:url";
import type { QueryInterface } from "sequelize";
import { SequelizeStorage, Umzug, type MigrationParams } from "umzug";
import { migrationSequelize } from "./db";

export type Migration = (params: MigrationParams<QueryInterface>) => Promise<void>;

const migrationsDir = join(process.cwd(), "migrations");

export function migrator(): Umzug<QueryInterface> {
  const db = migrationSequelize();
  const files = readdirSync(migrationsDir)
    .filter((f) => /^\d{4}-.*\.ts$/.test(f))
    .sort();
  return new Umzug({
    migrations: files.map((file) => {
      const path = join(migrationsDir, file);
      return {
        name: basename(file, ".ts"),
        up: async (params) => (await import(pathToFileURL(path).href)).up(params),
        down: async (params) => (await import(pathToFileURL(path).href)).down(params),
      };
    }),
    context: db.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize: db, tableName: "schema_migrations" }),
    logger: undefined,
  });
}
