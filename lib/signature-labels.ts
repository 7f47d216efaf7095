export const KIND_LABELS: Record<string, string> = {
  bleach: "Exciton bleach",
  "new-band": "New band",
  "pl-quench": "PL quench",
  shift: "Exciton shift",
  broadening: "Broadening",
};
