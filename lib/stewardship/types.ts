// Shapes of the pure retention logic: plain data, no database, no storage.

export type DataClass = "raw" | "processed" | "drafts";
export type ExpiryAction = "delete" | "flag";
export type HoldTargetType = "project" | "series" | "sample" | "spectrum";

/** A thing a policy can expire: a stored spectrum (raw file or failed draft) or an analysis run. */
export type RetainedItem = {
  kind: "spectrum" | "analysis-run";
  id: string;
  dataClass: DataClass;
  projectId: string;
  /** For a spectrum its own id; for a run the spectrum it belongs to. */
  spectrumId: string;
  seriesId: string | null;
  sampleId: string | null;
  /** Spectra only: the parent reference this spectrum is compared with. */
  referenceSpectrumId: string | null;
  createdAt: Date;
  sizeBytes: number;
  label: string;
  /** An analysis is queued or running on it: never removed from under the worker. */
  busy: boolean;
  /** The steward already decided to keep it after a flag. */
  keptByDecision: boolean;
  /** Already flagged and waiting for the steward. */
  flagged: boolean;
};

export type PolicyRule = { id: string; projectId: string; dataClass: DataClass; keepDays: number; onExpiry: ExpiryAction };
export type ActiveHold = { id: string; targetType: HoldTargetType; targetId: string; reason: string };

export type ProtectionReason =
  | { kind: "hold"; holdId: string; targetType: HoldTargetType; reason: string }
  | { kind: "reference"; dependentId: string; dependentLabel: string }
  | { kind: "busy" }
  | { kind: "kept" };

export type PlannedAction = { item: RetainedItem; policy: PolicyRule; expiredAt: Date };
export type ProtectedItem = PlannedAction & { protection: ProtectionReason };

export type SweepPlan = {
  /** In a safe order: every spectrum comes before the reference spectra it depends on. */
  toDelete: PlannedAction[];
  toFlag: PlannedAction[];
  protectedItems: ProtectedItem[];
};

export const DAY_MS = 86_400_000;
