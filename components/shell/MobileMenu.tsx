"use client";

import { useEffect, useState, type ReactNode } from "react";
import { usePathname } from "next/navigation";

/** Below the md breakpoint the navigation rail folds into a menu opened from the top bar. */
export function MobileMenu({ brand, children }: { brand: ReactNode; children: ReactNode }) {
  const [open, setOpen] = useState(false);
  const pathname = usePathname();
  useEffect(() => setOpen(false), [pathname]);

  return (
    <div className="sticky top-0 z-30 bg-dusk md:hidden">
      <div className="flex items-center justify-between px-4 py-2.5">
        {brand}
        <button
          type="button"
          aria-expanded={open}
          aria-controls="mobile-menu"
          onClick={() => setOpen((o) => !o)}
          className="rounded-md border border-dusk-line px-3 py-1.5 text-sm font-medium text-white"
        >
          {open ? "Close" : "Menu"}
        </button>
      </div>
      {open && (
        <div id="mobile-menu" className="max-h-[calc(100vh-3.25rem)] overflow-y-auto border-t border-dusk-line px-3 pb-4 pt-2">
          {children}
        </div>
      )}
    </div>
  );
}
