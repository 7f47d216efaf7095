"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import type { NavItem } from "@/lib/navigation";

/** The rail; `awaitingReview` puts the count of signatures awaiting review beside the Review entry. */
export function NavRail({ items, awaitingReview = 0 }: { items: NavItem[]; awaitingReview?: number }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Main" className="flex flex-col gap-0.5">
      {items.map((item) => {
        const active = item.href === "/" ? pathname === "/" : pathname.startsWith(item.href);
        return (
          <Link
            key={item.href}
            href={item.href}
            aria-current={active ? "page" : undefined}
            className={`group rounded-md px-3 py-2 transition-colors ${
              active ? "bg-dusk-light text-white" : "text-stone-300 hover:bg-dusk-light/60 hover:text-white"
            }`}
          >
            <span className="flex items-center justify-between text-sm font-medium">
              <span data-testid="nav-label">{item.label}</span>
              {item.href === "/review" && awaitingReview > 0 && (
                <span
                  data-testid="nav-awaiting-review"
                  aria-label={`${awaitingReview} awaiting review`}
                  className="tabular rounded-full bg-glow px-1.5 text-xs font-semibold text-white"
                >
                  {awaitingReview}
                </span>
              )}
            </span>
            <span className={`block text-xs ${active ? "text-stone-300" : "text-stone-500 group-hover:text-stone-400"}`}>{item.hint}</span>
          </Link>
        );
      })}
    </nav>
  );
}
