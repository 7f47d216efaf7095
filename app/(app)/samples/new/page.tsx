import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { writerMemberships } from "@/lib/auth/access";
import { listSampleChoices } from "@/lib/queries/samples";
import { listProjectChoices } from "@/lib/queries/projects";
import { PageHeader } from "@/components/ui/PageHeader";
import { EmptyState } from "@/components/ui/EmptyState";
import { SampleForm } from "@/components/samples/SampleForm";

export const metadata: Metadata = { title: "Register a sample" };

export default async function NewSamplePage() {
  const actor = await requireActor("/samples/new");
  const groups = writerMemberships(actor).map((m) => ({ id: m.groupId, name: m.groupName }));
  if (groups.length === 0) {
    return (
      <EmptyState title="Registering samples needs a spectroscopist or group-lead role">
        Ask your group lead to change your role.
      </EmptyState>
    );
  }
  const [samples, projects] = await Promise.all([listSampleChoices(actor), listProjectChoices(actor, "write")]);
  return (
    <>
      <PageHeader title="Register a sample" subtitle="One batch of dots. Products made from other batches list them as parents." />
      <SampleForm groups={groups} projects={projects} samples={samples} />
    </>
  );
}
