/** The standing cautions of every result and summary (the product's own wording, DESIGN.md "Cautions"). */
export const CAUTIONS = [
  'Headroom assists a qualified person; it does not replace the adopted plumbing code, the authority having jurisdiction, the manufacturers’ data or a licensed professional’s judgement.',
  'Verify the utility’s pressure — ideally with a current flow test, at the season of lowest pressure — and verify device losses with the product actually installed.',
  'Follow the local code where it differs from the defaults here.',
] as const;
