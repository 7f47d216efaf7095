import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import CredentialsImport from "next-auth/providers/credentials";
import { z } from "zod";
import { User, models } from "@/models";
import { recordAudit } from "@/lib/audit";
import { clearSignInFailures, recordFailedSignIn, signInAllowed } from "./rate-limit";

// Under plain Node ESM (scripts, tests) the CommonJS default arrives wrapped.
const Credentials = (CredentialsImport as unknown as { default?: typeof CredentialsImport }).default ?? CredentialsImport;

const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email(),
  password: z.string().min(1).max(200),
});

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/signin" },
  providers: [
    Credentials({
      name: "Bandkeep account",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(raw, req) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) return null;
        const { email, password } = parsed.data;
        const forwarded = req?.headers?.["x-forwarded-for"];
        const ip = (Array.isArray(forwarded) ? forwarded[0] : forwarded)?.split(",")[0]?.trim() || "local";
        if (!(await signInAllowed(email, ip))) {
          throw new Error("Too many sign-in attempts. Wait 15 minutes and try again.");
        }
        models();
        const user = await User.findOne({ where: { email } });
        const ok = user ? await bcrypt.compare(password, user.passwordHash) : false;
        await recordAudit({
          actorId: user?.id ?? null,
          actorLabel: email,
          action: ok ? "sign-in" : "sign-in-refused",
          details: { ip },
        });
        if (!user || !ok) {
          await recordFailedSignIn(email, ip);
          return null;
        }
        await clearSignInFailures(email);
        return { id: user.id, email: user.email, name: user.name };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) token.sub = user.id;
      return token;
    },
    async session({ session, token }) {
      if (session.user && token.sub) (session.user as { id?: string }).id = token.sub;
      return session;
    },
  },
};
