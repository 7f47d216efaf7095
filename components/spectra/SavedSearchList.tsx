import Link from "next/link";
import { countText } from "@/lib/search/fastCount";
import type { SavedSearch } from "@/lib/queries/savedSearches";
import { RemoveSavedSearch } from "./RemoveSavedSearch";

/** The person's saved spectra searches with what each finds now; each opens the search; each can be removed after a confirming click. */
export function SavedSearchList({ searches }: { searches: SavedSearch[] }) {
  return (
    <section className="mb-8" aria-labelledby="saved-searches">
      <h2 id="saved-searches" className="mb-2 text-sm font-semibold text-ink-soft">
        Saved searches
      </h2>
      <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white">
        {searches.map((s) => (
          <li key={s.id} className="flex items-center justify-between px-4 py-2 text-sm">
            <Link className="font-medium text-glow-deep hover:underline" href={`/spectra?${s.query}`}>
              {s.name}
            </Link>
            <span className="flex items-center gap-3">
              <span className="tabular text-ink-soft">
                {s.count
                  ? `${countText(s.count)} ${s.count.exact && s.count.value === 1 ? "spectrum" : "spectra"}`
                  : "no longer valid: open it and save again"}
              </span>
              <RemoveSavedSearch id={s.id} name={s.name} />
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
