import type { Metadata } from "next";
import { Logo } from "@/components/shell/Logo";
import { UnlockForm } from "@/components/auth/UnlockForm";

export const metadata: Metadata = { title: "Unlock account" };

// Reached from the mail sent when failed sign-ins locked an account. Opening the link changes
// nothing (mail scanners open links); the button does.
export default async function UnlockPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const raw = (await searchParams).token;
  const token = (Array.isArray(raw) ? raw[0] : raw) ?? "";
  return (
    <div className="flex min-h-screen items-center justify-center bg-dusk px-4">
      <div className="w-full max-w-sm rounded-xl bg-white p-8 shadow-xl">
        <div className="mb-6 flex items-center gap-3">
          <Logo className="h-9 w-9" />
          <h1 className="text-xl font-semibold">Unlock your account</h1>
        </div>
        <p className="mb-4 text-sm text-ink-soft">
          Many failed sign-ins paused sign-ins to your account from new addresses. Unlock it if you are its owner.
        </p>
        <UnlockForm token={token} />
      </div>
    </div>
  );
}
