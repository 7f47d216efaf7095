import { EmptyState } from "@/components/ui/EmptyState";

export function StewardOnly({ what = "This page" }: { what?: string }) {
  return (
    <div data-testid="steward-only">
      <EmptyState title={`${what} is for data stewards`}>
        Retention, legal holds, sharing and the audit trail are managed by your group&apos;s data steward.
      </EmptyState>
    </div>
  );
}
