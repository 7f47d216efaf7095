"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

const TABS = [
  { href: "/stewardship", label: "To decide" },
  { href: "/stewardship/policies", label: "Retention" },
  { href: "/stewardship/holds", label: "Legal holds" },
  { href: "/stewardship/sharing", label: "Sharing & members" },
  { href: "/stewardship/audit", label: "Audit trail" },
  { href: "/stewardship/storage", label: "Storage" },
  { href: "/stewardship/exports", label: "Exports" },
];

export function StewardTabs({ leadOnly }: { leadOnly: boolean }) {
  const path = usePathname();
  const tabs = leadOnly ? TABS.filter((t) => t.href === "/stewardship/sharing") : TABS;
  return (
    <nav aria-label="Stewardship" className="mb-5 flex flex-wrap gap-1 border-b border-stone-200">
      {tabs.map((t) => {
        const active = t.href === "/stewardship" ? path === t.href : path.startsWith(t.href);
        return (
          <Link key={t.href} href={t.href} aria-current={active ? "page" : undefined}
            className={`-mb-px rounded-t-md border px-3 py-1.5 text-sm ${active ? "border-stone-200 border-b-white bg-white font-medium text-ink" : "border-transparent text-ink-soft hover:text-ink"}`}>
            {t.label}
          </Link>
        );
      })}
    </nav>
  );
}
