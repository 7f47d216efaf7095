"use client";

import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { safeReturnPath } from "@/lib/auth/returnPath";
import { SIGN_IN_REFUSALS, type SignInRefusal } from "@/lib/auth/signInRefusals";

export function SignInForm({ returnTo }: { returnTo: string }) {
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const router = useRouter();

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setPending(true);
    setError(null);
    const result = await signIn("credentials", {
      email: String(form.get("email") ?? ""),
      password: String(form.get("password") ?? ""),
      redirect: false,
    });
    if (!result || result.error) {
      setPending(false);
      // Only our own refusal codes are shown; anything else (an outage's raw message) stays in the server log.
      const code = result?.error ?? "CredentialsSignin";
      setError(
        code === "CredentialsSignin"
          ? SIGN_IN_REFUSALS.mismatch
          : code in SIGN_IN_REFUSALS
            ? SIGN_IN_REFUSALS[code as SignInRefusal]
            : SIGN_IN_REFUSALS.unavailable,
      );
      return;
    }
    // a client navigation: the page's scripts are already loaded, only the signed-in page is fetched
    // (the refresh drops anything the router kept from before the session existed)
    router.refresh();
    router.replace(safeReturnPath(returnTo));
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <label className="block">
        <span className="text-sm font-medium">E-mail</span>
        <input
          name="email"
          type="email"
          autoComplete="username"
          required
          className="mt-1 w-full rounded-md border border-stone-300 px-3 py-2 focus:border-glow focus:outline-none focus:ring-2 focus:ring-glow/30"
        />
      </label>
      <label className="block">
        <span className="text-sm font-medium">Password</span>
        <input
          name="password"
          type="password"
          autoComplete="current-password"
          required
          className="mt-1 w-full rounded-md border border-stone-300 px-3 py-2 focus:border-glow focus:outline-none focus:ring-2 focus:ring-glow/30"
        />
      </label>
      {error && (
        <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-800">
          {error}
        </p>
      )}
      <button
        type="submit"
        disabled={pending}
        className="w-full rounded-md bg-glow px-4 py-2 font-medium text-white hover:bg-glow-deep disabled:opacity-60"
      >
        {pending ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
