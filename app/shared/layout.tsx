import type { Metadata } from "next";
import type { ReactNode } from "react";
import { Logo } from "@/components/shell/Logo";

// Read-only share links: outside the signed-in shell, no account needed. Search engines
// are asked not to index, and the token is not sent on as a referrer.
export const metadata: Metadata = {
  title: "Shared data",
  robots: { index: false, follow: false, nocache: true },
  referrer: "no-referrer",
};

export default function SharedLayout({ children }: { children: ReactNode }) {
  return (
    <div className="min-h-screen bg-stone-50">
      <header className="border-b border-stone-200 bg-white">
        <div className="mx-auto flex max-w-5xl items-center gap-3 px-4 py-3">
          <Logo className="h-7 w-7" />
          <span className="font-semibold">Bandkeep</span>
          <span className="text-sm text-ink-soft">· read-only link</span>
        </div>
      </header>
      <main className="mx-auto max-w-5xl px-4 py-6">{children}</main>
    </div>
  );
}
