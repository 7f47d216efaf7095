import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { listApiTokens } from "@/lib/api-tokens";
import { listOutbox, type OutboxMessage } from "@/lib/queries/outbox";
import { User } from "@/models";
import { PageHeader } from "@/components/ui/PageHeader";
import { ApiTokenPanel } from "@/components/settings/ApiTokenPanel";
import { NotificationForm } from "@/components/settings/NotificationForm";
import { formatWhen } from "@/lib/format/dates";

export const metadata: Metadata = { title: "Settings" };

function Section({ title, children, hint }: { title: string; hint?: string; children: React.ReactNode }) {
  return (
    <section className="rounded-lg border border-stone-200 bg-white p-5">
      <h2 className="text-base font-semibold">{title}</h2>
      {hint && <p className="mb-3 text-sm text-ink-soft">{hint}</p>}
      {children}
    </section>
  );
}

export default async function SettingsPage() {
  const actor = await requireActor("/settings");
  const [user, tokens] = await Promise.all([User.findByPk(actor.id), listApiTokens(actor.id)]);
  let outbox: OutboxMessage[] | null = null;
  let outboxError: string | null = null;
  if (actor.isSiteAdmin) {
    try {
      outbox = await listOutbox();
    } catch (e) {
      outboxError = e instanceof Error ? e.message : String(e);
    }
  }
  return (
    <>
      <PageHeader title="Settings" subtitle={actor.email} />
      <div className="grid max-w-4xl gap-5">
        <Section title="API tokens" hint="For lab scripts that upload spectra or read analyses. A token acts with your roles.">
          <ApiTokenPanel tokens={tokens} />
        </Section>
        <Section title="Notifications">
          <NotificationForm notifyDigest={user?.notifyDigest ?? true} notifyDecisions={user?.notifyDecisions ?? true} />
        </Section>
        {actor.isSiteAdmin && (
          <Section title="Outbox" hint="Mail the app has sent, as captured by the local mail service. Shown to site administrators only.">
            {outboxError ? (
              <p role="alert" className="text-sm text-red-700">
                The mail capture service cannot be reached ({outboxError}).
              </p>
            ) : outbox === null ? (
              <p className="text-sm text-ink-soft">No capture service is configured (MAIL_VIEW_URL): mail goes to the real relay.</p>
            ) : outbox.length === 0 ? (
              <p className="text-sm text-ink-soft">No mail sent yet.</p>
            ) : (
              <ul className="divide-y divide-stone-100" data-testid="outbox">
                {outbox.map((m) => (
                  <li key={m.id} className="py-2 text-sm">
                    <details>
                      <summary className="cursor-pointer">
                        <span className="font-medium">{m.subject || "(no subject)"}</span>{" "}
                        <span className="text-ink-soft">
                          to {m.to.join(", ")} · {formatWhen(m.receivedAt)}
                        </span>
                      </summary>
                      <pre className="mt-2 whitespace-pre-wrap rounded bg-stone-50 p-2 text-xs">{m.body}</pre>
                    </details>
                  </li>
                ))}
              </ul>
            )}
          </Section>
        )}
      </div>
    </>
  );
}
