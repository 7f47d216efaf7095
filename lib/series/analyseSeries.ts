import { fitBreakpoint, type BreakpointFit } from "@/lib/fits/fitBreakpoint";
import { fitSternVolmer, type SternVolmerFit } from "@/lib/fits/fitSternVolmer";

export type SeriesFits = {
  saturation: { fit: BreakpointFit; points: number } | { fit: null; reason: string };
  sternVolmer: { fit: SternVolmerFit; points: number } | { fit: null; reason: string };
};

type Point = { value: number | null; bleachFraction: number | null; quenchFraction: number | null };

const usable = (points: Point[], key: "bleachFraction" | "quenchFraction") =>
  points.filter((p): p is Point & { value: number } => p.value !== null && p[key] !== null);

/** Runs the fits a series supports: saturation (breakpoint) of the bleach, Stern–Volmer of the quench. */
export function analyseSeries(points: Point[]): SeriesFits {
  const bleach = usable(points, "bleachFraction").filter((p) => p.bleachFraction! > 0 || p.value > 0);
  let saturation: SeriesFits["saturation"];
  const withBleach = bleach.filter((p) => p.bleachFraction! > 0).length;
  if (withBleach < 2 || bleach.length < 4) {
    saturation = {
      fit: null,
      reason:
        bleach.length === 0
          ? "No bleach measured in this series."
          : `A saturation fit needs at least 4 points with a variable value and a measured bleach (this series has ${bleach.length}).`,
    };
  } else {
    try {
      saturation = {
        fit: fitBreakpoint(
          bleach.map((p) => p.value),
          bleach.map((p) => p.bleachFraction!),
        ),
        points: bleach.length,
      };
    } catch (error) {
      saturation = {
        fit: null,
        reason: `The saturation fit could not be made: ${error instanceof Error ? error.message : String(error)}.`,
      };
    }
  }
  const quench = usable(points, "quenchFraction");
  let sternVolmer: SeriesFits["sternVolmer"];
  if (quench.filter((p) => p.quenchFraction! > 0).length < 2 || quench.length < 3) {
    sternVolmer = {
      fit: null,
      reason:
        quench.length === 0
          ? "No PL quench measured in this series."
          : `A Stern–Volmer fit needs at least 3 points with a quencher concentration and a measured quench (this series has ${quench.length}).`,
    };
  } else {
    try {
      sternVolmer = {
        fit: fitSternVolmer(
          quench.map((p) => p.value),
          quench.map((p) => p.quenchFraction!),
        ),
        points: quench.length,
      };
    } catch (error) {
      sternVolmer = {
        fit: null,
        reason: `The Stern–Volmer fit could not be made: ${error instanceof Error ? error.message : String(error)}.`,
      };
    }
  }
  return { saturation, sternVolmer };
}
