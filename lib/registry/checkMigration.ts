// The migration a new flag kind, technique or magnitude unit needs, in one line:
//   export const { up, down } = registryValuesMigration("signatureKind", ["my-kind"]);
// up adds the values to the column's live CHECK constraint, down takes them out again.

import type { Migration } from "../migrator";
import { REGISTRY_COLUMNS, addCheckValues, removeCheckValues, type RegistryColumnName } from "./sqlChecks";

export function registryValuesMigration(column: RegistryColumnName, values: readonly string[]): { up: Migration; down: Migration } {
  const c = REGISTRY_COLUMNS[column];
  const io = (qi: Parameters<Migration>[0]["context"]) => ({
    query: async (sql: string) => (await qi.sequelize.query(sql))[0] as { def: string }[],
    exec: (sql: string) => qi.sequelize.query(sql),
  });
  return {
    up: async ({ context: qi }) => {
      const { query, exec } = io(qi);
      await addCheckValues(query, exec, c, values);
    },
    down: async ({ context: qi }) => {
      const { query, exec } = io(qi);
      await removeCheckValues(query, exec, c, values);
    },
  };
}
