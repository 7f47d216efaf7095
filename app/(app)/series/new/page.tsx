import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { listProjectChoices } from "@/lib/queries/projects";
import { SeriesForm } from "@/components/series/SeriesForm";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "New series" };

export default async function NewSeriesPage() {
  const actor = await requireActor("/series/new");
  const projects = await listProjectChoices(actor, "write");
  if (projects.length === 0) {
    return (
      <EmptyState title="No project to add a series to">
        Series are created by spectroscopists and group leads in their group&apos;s projects.
      </EmptyState>
    );
  }
  return (
    <>
      <PageHeader
        title="New series"
        subtitle="An ordered set of spectra along one variable: equivalents added, shell monolayers, minutes."
      />
      <SeriesForm projects={projects} />
    </>
  );
}
