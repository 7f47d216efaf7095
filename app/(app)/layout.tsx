import type { ReactNode } from "react";
import { requireActor, type Actor } from "@/lib/auth/actor";
import { navFor, ROLE_LABELS } from "@/lib/navigation";
import { Logo } from "@/components/shell/Logo";
import { MobileMenu } from "@/components/shell/MobileMenu";
import { NavRail } from "@/components/shell/NavRail";
import { leadGroupIds } from "@/lib/auth/access";
import { awaitingReviewCounts } from "@/lib/review/counts";
import { SignOutButton } from "@/components/shell/SignOutButton";

function Brand() {
  return (
    <div className="flex items-center gap-2 px-2">
      <Logo />
      <span className="text-lg font-semibold tracking-tight text-white">Bandkeep</span>
    </div>
  );
}

function WhoAmI({ actor }: { actor: Actor }) {
  return (
    <div className="border-t border-dusk-line px-2 pt-3">
      <p className="truncate text-sm text-white" data-testid="signed-in-as">
        {actor.name}
      </p>
      <ul className="mb-2 mt-1 space-y-0.5">
        {actor.memberships.map((m) => (
          <li key={m.groupId} className="text-xs text-stone-400">
            {m.groupName} · <span data-testid="role">{ROLE_LABELS[m.role]}</span>
          </li>
        ))}
      </ul>
      <SignOutButton />
    </div>
  );
}

export default async function AppLayout({ children }: { children: ReactNode }) {
  const actor = await requireActor();
  const items = navFor(actor);
  const leads = leadGroupIds(actor);
  // The same count as the queue and Overview (lib/review/counts.ts); only leads see review state.
  const toReview = leads.length > 0 ? (await awaitingReviewCounts(leads)).total : 0;
  return (
    <div className="min-h-screen md:flex">
      <aside className="sticky top-0 hidden h-screen w-60 shrink-0 flex-col bg-dusk px-3 py-4 md:flex">
        <div className="mb-6">
          <Brand />
        </div>
        <NavRail items={items} awaitingReview={toReview} />
        <div className="mt-auto">
          <WhoAmI actor={actor} />
        </div>
      </aside>
      <MobileMenu brand={<Brand />}>
        <NavRail items={items} awaitingReview={toReview} />
        <div className="mt-3">
          <WhoAmI actor={actor} />
        </div>
      </MobileMenu>
      <main className="min-w-0 flex-1 px-4 py-5 md:px-8 md:py-6">{children}</main>
    </div>
  );
}
