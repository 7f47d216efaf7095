"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

type Tab = { href: string; label: string };

// Two shelves in the lab's own terms: what happens to the data, and who reaches it.
const DATA_TABS: Tab[] = [
  { href: "/stewardship", label: "Clean-up due" },
  { href: "/stewardship/policies", label: "Keep rules" },
  { href: "/stewardship/holds", label: "Holds" },
  { href: "/stewardship/storage", label: "Space used" },
  { href: "/stewardship/exports", label: "Bundles" },
];
const PEOPLE_TABS: Tab[] = [
  { href: "/stewardship/sharing", label: "People & sharing" },
  { href: "/stewardship/audit", label: "Audit trail" },
];

function Shelf({ title, tabs, path }: { title: string; tabs: Tab[]; path: string }) {
  return (
    <div className="flex flex-wrap items-center gap-1">
      <span className="mr-1 text-xs font-medium text-ink-soft">{title}</span>
      {tabs.map((t) => {
        const active = t.href === "/stewardship" ? path === t.href : path.startsWith(t.href);
        return (
          <Link
            key={t.href}
            href={t.href}
            aria-current={active ? "page" : undefined}
            className={`rounded-full px-3 py-1 text-sm ${active ? "bg-dusk text-white" : "text-ink-soft hover:bg-stone-200 hover:text-ink"}`}
          >
            {t.label}
          </Link>
        );
      })}
    </div>
  );
}

export function StewardTabs({ leadOnly }: { leadOnly: boolean }) {
  const path = usePathname();
  return (
    <nav aria-label="Data care" className="mb-5 flex flex-col gap-2 rounded-lg bg-stone-100 px-3 py-2 sm:flex-row sm:gap-6">
      {!leadOnly && <Shelf title="Data" tabs={DATA_TABS} path={path} />}
      <Shelf title="People" tabs={leadOnly ? PEOPLE_TABS.filter((t) => t.href === "/stewardship/sharing") : PEOPLE_TABS} path={path} />
    </nav>
  );
}
