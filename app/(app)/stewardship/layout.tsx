import type { ReactNode } from "react";
import { requireActor } from "@/lib/auth/actor";
import { leadGroupIds, stewardGroupIds } from "@/lib/auth/access";
import { StewardTabs } from "@/components/stewardship/StewardTabs";

export default async function StewardshipLayout({ children }: { children: ReactNode }) {
  const actor = await requireActor("/stewardship");
  const steward = stewardGroupIds(actor).length > 0;
  const lead = leadGroupIds(actor).length > 0;
  return (
    <>
      {(steward || lead) && <StewardTabs leadOnly={!steward} />}
      {children}
    </>
  );
}
