import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import CredentialsImport from "next-auth/providers/credentials";
import { z } from "zod";
import { User } from "@/models";
import { recordAudit } from "@/lib/audit";
import { config } from "@/lib/config";
import { sendMail } from "@/lib/mail";
import { CLIENT_ADDRESS_HEADER } from "@/lib/clientAddressHeader";
import { SignInRefused } from "./signInRefusals";
import {
  issueUnlockToken,
  recordFailedSignIn,
  recordSuccessfulSignIn,
  signInGate,
  UNLOCK_LINK_SECONDS,
  type FailureCount,
} from "./rate-limit";
import { currentSessionVersion, revokeSessions } from "./sessionVersion";
import { safeReturnPath } from "@/lib/auth/returnPath";

// Under plain Node ESM (scripts, tests) the CommonJS default arrives wrapped.
const Credentials = (CredentialsImport as unknown as { default?: typeof CredentialsImport }).default ?? CredentialsImport;

const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email(),
  password: z.string().min(1).max(200),
});

// An unknown account costs the same bcrypt work as a known one (same cost factor as
// stored hashes: lib/stewardship/acceptInvitation.ts and the seed use 10), so the answer's
// timing does not tell which e-mail addresses have accounts.
let dummyHash: Promise<string> | undefined;
const hashForUnknownAccount = () => (dummyHash ??= bcrypt.hash(`no account ${Math.random()}`, 10));

type HeaderBag = Record<string, string | string[] | undefined> | undefined;
function clientAddressOf(headers: HeaderBag): string {
  const value = headers?.[CLIENT_ADDRESS_HEADER];
  return (Array.isArray(value) ? value[0] : value) || "unknown";
}

/**
 * Failed attempts are counted for every one; the audit trail gets one event per burst:
 * the first failure of an address in the limiter's window, the first of an existing account,
 * and the attempt that locks the account (each with the counts so far).
 */
async function auditFailure(email: string, userId: string | null, address: string, count: FailureCount): Promise<void> {
  const details = { address, failuresFromAddress: count.address, failuresOfAccount: count.account };
  if (count.address === 1 || (userId && count.account === 1)) {
    await recordAudit({ actorId: userId, actorLabel: email, action: "sign-in-refused", details });
  }
  if (count.lockedNow) await recordAudit({ actorId: userId, actorLabel: email, action: "sign-in-locked", details });
}

async function mailUnlockLink(email: string): Promise<void> {
  const token = await issueUnlockToken(email);
  const link = `${config().APP_URL.replace(/\/$/, "")}/signin/unlock?token=${token}`;
  await sendMail(
    email,
    "Bandkeep: your account was locked after failed sign-ins",
    `Someone failed to sign in to your Bandkeep account many times, so sign-ins from new addresses are paused for 15 minutes.\n\n` +
      `If that was you, or you want the lock lifted now, open this link within ${UNLOCK_LINK_SECONDS / 60} minutes:\n${link}\n\n` +
      `Addresses you signed in from before still work. If you did not try to sign in, consider changing your password.`,
  );
}

async function authorize(raw: unknown, headers: HeaderBag) {
  const parsed = credentialsSchema.safeParse(raw);
  if (!parsed.success) return null;
  const { email, password } = parsed.data;
  const address = clientAddressOf(headers);
  const gate = await signInGate(email, address);
  if (!gate.allowed) throw new SignInRefused(gate.code);
  const user = await User.findOne({ where: { email } });
  const ok = await bcrypt.compare(password, user?.passwordHash ?? (await hashForUnknownAccount()));
  if (!user || !ok) {
    const count = await recordFailedSignIn(email, address);
    await auditFailure(email, user?.id ?? null, address, count);
    if (count.lockedNow && user) await mailUnlockLink(email);
    return null;
  }
  await recordSuccessfulSignIn(email, address);
  await recordAudit({ actorId: user.id, actorLabel: email, action: "sign-in", details: { address } });
  return { id: user.id, email: user.email, name: user.name, sessionVersion: await currentSessionVersion(user.id) };
}

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/signin" },
  providers: [
    Credentials({
      name: "Bandkeep account",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(raw, req) {
        try {
          return await authorize(raw, req?.headers as HeaderBag);
        } catch (error) {
          if (error instanceof SignInRefused) throw error;
          // The detail stays in the server log; the form shows a generic text.
          console.error("sign-in failed:", error);
          throw new SignInRefused("unavailable");
        }
      },
    }),
  ],
  events: {
    // Server-side revocation: the signed-out cookie (and any copy of it) stops working.
    async signOut({ token }) {
      if (token?.sub) await revokeSessions(token.sub);
    },
  },
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        token.sv = (user as { sessionVersion?: number }).sessionVersion ?? 0;
      }
      return token;
    },
    async session({ session, token }) {
      if (session.user && token.sub) Object.assign(session.user, { id: token.sub, sessionVersion: Number(token.sv ?? 0) });
      return session;
    },
    // Only same-origin destinations after sign-in and sign-out.
    async redirect({ url, baseUrl }) {
      if (url.startsWith("/")) return `${baseUrl}${safeReturnPath(url)}`;
      try {
        const target = new URL(url);
        if (target.origin === new URL(baseUrl).origin)
          return `${baseUrl}${safeReturnPath(`${target.pathname}${target.search}${target.hash}`)}`;
      } catch {
        // not a URL: fall through
      }
      return baseUrl;
    },
  },
};
