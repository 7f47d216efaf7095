import { selectRows, sequelize } from "@/lib/db";

// A browser session carries the person's session version from sign-in (token.sv).
// Signing out bumps the version, so a cookie copied before sign-out is refused by
// currentActor() from then on, on every device of that person.

export async function currentSessionVersion(userId: string): Promise<number> {
  const [row] = await selectRows<{ session_version: number }>("SELECT session_version FROM users WHERE id = :userId", { userId });
  return row?.session_version ?? 0;
}

export async function revokeSessions(userId: string): Promise<void> {
  await sequelize().query("UPDATE users SET session_version = session_version + 1 WHERE id = :userId", { replacements: { userId } });
}
