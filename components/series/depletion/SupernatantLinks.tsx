"use client";

import Link from "next/link";
import { useActionState, useState } from "react";
import { linkSupernatant, unlinkSupernatant } from "@/app/(app)/series/actions";
import { initialActionState } from "@/lib/actions/protected-state";
import type { DepletionSetupView } from "@/lib/queries/series-depletion";

const input = "rounded-md border border-stone-300 px-2 py-1 text-sm aria-[invalid=true]:border-red-500";
const button = "rounded-md border border-stone-300 bg-white px-2.5 py-1 text-sm hover:bg-stone-50 disabled:opacity-60";

function UnlinkButton({
  seriesId,
  supernatantSpectrumId,
  fileName,
}: {
  seriesId: string;
  supernatantSpectrumId: string;
  fileName: string;
}) {
  const [state, action, pending] = useActionState(unlinkSupernatant, initialActionState);
  return (
    <form action={action} className="inline">
      <input type="hidden" name="seriesId" value={seriesId} />
      <input type="hidden" name="supernatantSpectrumId" value={supernatantSpectrumId} />
      <button disabled={pending} className="text-xs text-glow-deep hover:underline disabled:opacity-60" aria-label={`Unlink ${fileName}`}>
        unlink
      </button>
      {state.message && !state.ok && (
        <span role="alert" className="ml-2 text-xs text-red-700">
          {state.message}
        </span>
      )}
    </form>
  );
}

/**
 * Which stored spectrum is the supernatant of which point: the current links (with unlink for
 * people who may add data) and a form to add one.
 */
export function SupernatantLinks({ seriesId, setup, mayWrite }: { seriesId: string; setup: DepletionSetupView; mayWrite: boolean }) {
  const [state, action, pending] = useActionState(linkSupernatant, initialActionState);
  const err = (f: string) => state.fieldErrors?.[f]?.join(" ");
  const open = setup.links.filter((l) => !l.supernatant);
  const linked = setup.links.filter((l) => l.supernatant);
  // Open at first when nothing is linked; after that the person opens and closes it.
  const [openAtFirst] = useState(linked.length === 0);
  return (
    <details className="mt-3 text-xs text-ink-soft" data-testid="supernatant-links" open={openAtFirst || undefined}>
      <summary className="cursor-pointer select-none">
        Links: {linked.length} of {setup.links.length} point{setup.links.length === 1 ? " has" : "s have"} a supernatant spectrum
        {mayWrite ? " (link or unlink)" : ""}
      </summary>
      <div className="mt-1">
        {linked.length > 0 && (
          <ul className="mb-2 space-y-0.5">
            {linked.map((l) => (
              <li key={l.pointSpectrumId}>
                point {l.value ?? "—"} ({l.pointFileName}): supernatant{" "}
                <Link className="text-glow-deep hover:underline" href={`/spectra/${l.supernatant!.spectrumId}`}>
                  {l.supernatant!.fileName}
                </Link>
                {mayWrite && (
                  <>
                    {" "}
                    ·{" "}
                    <UnlinkButton
                      seriesId={seriesId}
                      supernatantSpectrumId={l.supernatant!.spectrumId}
                      fileName={l.supernatant!.fileName}
                    />
                  </>
                )}
              </li>
            ))}
          </ul>
        )}
        {mayWrite &&
          open.length > 0 &&
          (setup.linkable.length === 0 ? (
            <p>
              To link a supernatant, first{" "}
              <Link className="text-glow-deep hover:underline" href="/upload">
                upload
              </Link>{" "}
              its absorption spectrum to this series&apos; project without choosing a series; it then appears here.
            </p>
          ) : (
            <form action={action} className="flex flex-wrap items-end gap-2">
              <input type="hidden" name="seriesId" value={seriesId} />
              <label htmlFor="link-supernatant">
                Supernatant spectrum
                <br />
                <select
                  id="link-supernatant"
                  name="supernatantSpectrumId"
                  className={input}
                  aria-invalid={Boolean(err("supernatantSpectrumId")) || undefined}
                  defaultValue={state.values?.supernatantSpectrumId ?? ""}
                >
                  <option value="" disabled>
                    choose…
                  </option>
                  {setup.linkable.map((s) => (
                    <option key={s.spectrumId} value={s.spectrumId}>
                      {s.fileName}
                    </option>
                  ))}
                </select>
                {err("supernatantSpectrumId") && (
                  <span role="alert" className="block text-red-700">
                    {err("supernatantSpectrumId")}
                  </span>
                )}
              </label>
              <label htmlFor="link-point">
                is the supernatant of the point
                <br />
                <select
                  id="link-point"
                  name="pointSpectrumId"
                  className={input}
                  aria-invalid={Boolean(err("pointSpectrumId")) || undefined}
                  defaultValue={state.values?.pointSpectrumId ?? ""}
                >
                  <option value="" disabled>
                    choose…
                  </option>
                  {open.map((l) => (
                    <option key={l.pointSpectrumId} value={l.pointSpectrumId}>
                      {l.value ?? "—"}: {l.pointFileName}
                    </option>
                  ))}
                </select>
                {err("pointSpectrumId") && (
                  <span role="alert" className="block text-red-700">
                    {err("pointSpectrumId")}
                  </span>
                )}
              </label>
              <button disabled={pending} className={button}>
                Link
              </button>
              {state.message && (state.ok || !state.fieldErrors) && (
                <span role={state.ok ? "status" : "alert"} className={state.ok ? "text-ink-soft" : "text-red-700"}>
                  {state.message}
                </span>
              )}
            </form>
          ))}
      </div>
    </details>
  );
}
