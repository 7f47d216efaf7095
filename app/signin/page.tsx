import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentActor } from "@/lib/auth/actor";
import { Logo } from "@/components/shell/Logo";
import { SignInForm } from "@/components/auth/SignInForm";
import { safeReturnPath } from "@/lib/auth/returnPath";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const returnTo = safeReturnPath((await searchParams).callbackUrl);
  if (await currentActor()) redirect(returnTo);
  return (
    <div className="flex min-h-screen items-center justify-center bg-dusk px-4">
      <div className="w-full max-w-sm rounded-xl bg-white p-8 shadow-xl">
        <div className="mb-6 flex items-center gap-3">
          <Logo className="h-9 w-9" />
          <div>
            <h1 className="text-xl font-semibold">Sign in to Bandkeep</h1>
            <p className="text-sm text-ink-soft">Spectra, band changes and their review</p>
          </div>
        </div>
        <SignInForm returnTo={returnTo} />
      </div>
    </div>
  );
}
