import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { managedMemberships, stewardGroupIds } from "@/lib/auth/access";
import { listInvitations, listMembers, listShares, shareTargetOptions } from "@/lib/stewardship/queries";
import { listShareLinks } from "@/lib/stewardship/shareLinks";
import { CollaboratorShares } from "@/components/stewardship/CollaboratorShares";
import { InvitationList } from "@/components/stewardship/InvitationList";
import { InviteForm } from "@/components/stewardship/InviteForm";
import { MembersTable } from "@/components/stewardship/MembersTable";
import { ShareLinkPanel } from "@/components/stewardship/ShareLinkPanel";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "People & sharing · Data care" };

export default async function SharingPage() {
  const actor = await requireActor("/stewardship/sharing");
  const groups = managedMemberships(actor);
  if (groups.length === 0) return <StewardOnly what="Sharing and members" />;
  const isSteward = stewardGroupIds(actor).length > 0;
  const [members, invitations, shares, targets, links] = await Promise.all([
    listMembers(actor),
    listInvitations(actor),
    isSteward ? listShares(actor) : [],
    shareTargetOptions(actor),
    isSteward ? listShareLinks(actor) : [],
  ]);
  return (
    <>
      <PageHeader
        title="People & sharing"
        subtitle="Members of your groups, invitations by e-mail, and read-only shares with collaborators outside the group. Changes take effect at once."
      />
      <InviteForm groups={groups} targets={targets} />
      <MembersTable members={members} />
      {isSteward && <CollaboratorShares shares={shares} targets={targets} />}

      {isSteward && (
        <section className="mb-6" aria-labelledby="share-links-heading">
          <h2 id="share-links-heading" className="mb-1 text-base font-semibold">
            Links
          </h2>
          <p className="mb-2 text-sm text-ink-soft">
            A read-only link to one project or series, for someone without an account. Only its fingerprint is stored, so the link is shown
            once; revoking it or reaching its expiry stops it at the next request.
          </p>
          <ShareLinkPanel targets={targets} links={links} />
        </section>
      )}

      <InvitationList invitations={invitations} />
    </>
  );
}
