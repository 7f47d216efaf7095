// What people call each flag kind: written once in the flag-kind registry.
export { KIND_LABELS } from "@/lib/registry/flagKinds";
