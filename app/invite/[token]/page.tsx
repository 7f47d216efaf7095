import type { Metadata } from "next";
import Link from "next/link";
import { currentActor } from "@/lib/auth/actor";
import { ROLE_LABELS } from "@/lib/navigation";
import { usableInvitation, type InvitationView } from "@/lib/stewardship/acceptInvitation";
import { Logo } from "@/components/shell/Logo";
import { AcceptInvitationForm } from "@/components/stewardship/AcceptInvitationForm";
import { Refusal } from "@/lib/errors";

export const metadata: Metadata = { title: "Invitation" };
export const dynamic = "force-dynamic";

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let view: InvitationView | null = null;
  let problem: string | null = null;
  try {
    view = (await usableInvitation(token)).view;
  } catch (error) {
    if (!(error instanceof Refusal)) throw error;
    problem = error.message;
  }
  const actor = await currentActor();
  return (
    <div className="flex min-h-screen items-center justify-center bg-dusk px-4">
      <div className="w-full max-w-md rounded-xl bg-white p-8 shadow-xl">
        <div className="mb-6 flex items-center gap-3">
          <Logo className="h-9 w-9" />
          <h1 className="text-xl font-semibold">Invitation to Bandkeep</h1>
        </div>
        {problem || !view ? (
          <p role="alert" className="text-sm text-red-700" data-testid="invite-problem">
            {problem}
          </p>
        ) : (
          <>
            <p className="mb-4 text-sm">
              You are invited to <strong>{view.groupName}</strong> as <strong>{ROLE_LABELS[view.role as keyof typeof ROLE_LABELS]}</strong>,
              for <strong>{view.email}</strong>.
            </p>
            {actor && actor.email !== view.email ? (
              <p role="alert" className="text-sm text-red-700">
                You are signed in as {actor.email}. Sign out, then open the link again.
              </p>
            ) : !actor && view.accountExists ? (
              <p className="text-sm">
                An account for {view.email} exists.{" "}
                <Link className="text-glow underline" href={`/signin?callbackUrl=${encodeURIComponent(`/invite/${token}`)}`}>
                  Sign in
                </Link>
                , then accept.
              </p>
            ) : (
              <AcceptInvitationForm token={token} needsAccount={!actor} />
            )}
          </>
        )}
      </div>
    </div>
  );
}
