import { QueryTypes, type Sequelize } from "sequelize";

/**
 * The role the app connects as: DATABASE_URL's user. Answers null when that is the role
 * running the migrations (a single-role set-up, where there is nothing to grant), and
 * refuses a role that does not exist, so a typo is not silently left without grants.
 */
export async function appRoleFor(sequelize: Sequelize): Promise<string | null> {
  const url = process.env.DATABASE_URL;
  if (!url) return null;
  const role = decodeURIComponent(new URL(url).username);
  if (!/^[a-z_][a-z0-9_]{0,62}$/.test(role))
    throw new Error(`DATABASE_URL's user "${role}" is not a plain role name (lower-case letters, digits, _)`);
  const [me] = await sequelize.query<{ current_user: string }>("SELECT current_user", { type: QueryTypes.SELECT });
  if (me?.current_user === role) return null;
  const found = await sequelize.query("SELECT 1 FROM pg_roles WHERE rolname = :role", { replacements: { role }, type: QueryTypes.SELECT });
  if (found.length === 0)
    throw new Error(`the app role "${role}" (DATABASE_URL's user) does not exist: create it first (README, "Managed services")`);
  return role;
}
