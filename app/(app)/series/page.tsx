import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { writesSomewhere } from "@/lib/auth/access";
import { listSeries } from "@/lib/queries/series";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { CardTable } from "@/components/ui/CardTable";

export const metadata: Metadata = { title: "Series" };

export default async function SeriesPage() {
  const actor = await requireActor("/series");
  const series = await listSeries(actor);
  const mayCreate = writesSomewhere(actor);
  return (
    <>
      <PageHeader
        title="Series"
        subtitle="Titrations, shell-thickness and time series: ordered spectra with a variable, plotted and fitted."
        actions={
          mayCreate && (
            <Link href="/series/new" className="rounded-md bg-glow px-3 py-2 text-sm font-medium text-white hover:bg-glow-deep">
              New series
            </Link>
          )
        }
      />
      {series.length === 0 ? (
        <EmptyState title="No series yet" action={mayCreate ? { href: "/series/new", label: "Create the first series" } : undefined}>
          A series groups spectra along a variable, such as equivalents of added dots. Choose a series and its variable value when you
          upload.
        </EmptyState>
      ) : (
        <CardTable headers={["Series", "Kind", "Variable", "Project", "Spectra"]}>
          {series.map((s) => (
            <tr key={s.id} className="border-t border-stone-100 hover:bg-stone-50">
              <td className="px-3 py-2">
                <Link prefetch={false} className="font-medium text-glow-deep hover:underline" href={`/series/${s.id}`}>
                  {s.name}
                </Link>
                {s.shared && <span className="ml-2 rounded bg-stone-100 px-1.5 text-xs text-ink-soft">shared with you</span>}
              </td>
              <td className="px-3 py-2">{s.kind}</td>
              <td className="px-3 py-2">{s.variable}</td>
              <td className="px-3 py-2 text-ink-soft">{s.projectName}</td>
              <td className="tabular px-3 py-2">{s.spectrumCount}</td>
            </tr>
          ))}
        </CardTable>
      )}
    </>
  );
}
