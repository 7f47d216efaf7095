import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { config } from "@/lib/config";
import { getUploadChoices } from "@/lib/queries/spectrum-status";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { UploadWorkbench } from "@/components/upload/UploadWorkbench";

export const metadata: Metadata = { title: "Upload" };
export const dynamic = "force-dynamic";

export default async function UploadPage() {
  const actor = await requireActor("/upload");
  const choices = await getUploadChoices(actor);
  const maxBytes = config().UPLOAD_MAX_BYTES;
  return (
    <>
      <PageHeader
        title="Upload spectra"
        subtitle={`Exports, folders or zips; up to ${Math.round(maxBytes / 1024 / 1024)} MiB per file. Raw files are kept exactly as they arrive, even when they cannot be read.`}
      />
      {choices.projects.length === 0 ? (
        <EmptyState title="No project to upload to">
          Uploading needs the spectroscopist or group lead role in a group with a project. Ask your group lead to add you.
        </EmptyState>
      ) : (
        <UploadWorkbench choices={choices} maxBytes={maxBytes} />
      )}
    </>
  );
}
