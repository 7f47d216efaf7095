import type { ReactNode } from "react";
import { requireActor } from "@/lib/auth/actor";
import { StewardTabs } from "@/components/stewardship/StewardTabs";

export default async function StewardshipLayout({ children }: { children: ReactNode }) {
  const actor = await requireActor("/stewardship");
  const steward = actor.memberships.some((m) => m.role === "steward");
  const lead = actor.memberships.some((m) => m.role === "lead");
  return (
    <>
      {(steward || lead) && <StewardTabs leadOnly={!steward} />}
      {children}
    </>
  );
}
