import { HazardNotice } from "@/components/ui/HazardNotice";
import { LIGHT_CAUTION, usesUvOrLaserLight } from "@/lib/hazards";
import type { SpectrumDetail } from "@/lib/queries/spectrum-detail";

/** The sample's substance hazards and, for light-based techniques, the UV and laser caution. */
export function SpectrumCautions({ s }: { s: Pick<SpectrumDetail, "sample" | "technique"> }) {
  return (
    <>
      {s.sample && s.sample.hazards.length > 0 && (
        <div className="mb-4">
          <HazardNotice flags={s.sample.hazards} />
        </div>
      )}
      {usesUvOrLaserLight(s.technique) && (
        <p role="note" aria-label="Light safety" className="mb-4 rounded-lg border border-caution/40 bg-caution-soft px-4 py-2 text-sm">
          <span className="font-semibold text-caution">⚠ UV and laser light.</span> {LIGHT_CAUTION} Your institution&apos;s laser safety
          rules take precedence.
        </p>
      )}
    </>
  );
}
