import Link from "next/link";
import type { ReactNode } from "react";

export function EmptyState({ title, children, action }: { title: string; children: ReactNode; action?: { href: string; label: string } }) {
  return (
    <div className="rounded-xl border border-dashed border-stone-300 bg-white px-6 py-10 text-center">
      <h2 className="text-base font-semibold">{title}</h2>
      <div className="mx-auto mt-1 max-w-md text-sm text-ink-soft">{children}</div>
      {action && (
        <Link
          href={action.href}
          className="mt-4 inline-block rounded-md bg-glow px-4 py-2 text-sm font-medium text-white hover:bg-glow-deep"
        >
          {action.label}
        </Link>
      )}
    </div>
  );
}
