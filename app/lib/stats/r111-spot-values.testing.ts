// OIML R 111-1:2004 Table 1 spot values (S, two transcriptions agree; REFERENCE.md §1), shared by the look-up test
// and the weight-suitability test so the published figures are typed once.

/** [class, nominal in g, maximum permissible error in mg] */
export const R111_SPOT_VALUES = [
  ["E2", 1, 0.03], ["F1", 1, 0.1], ["F2", 1, 0.3], ["M1", 1, 1.0],
  ["E2", 100, 0.16], ["F1", 100, 0.5], ["F2", 100, 1.6], ["M1", 100, 5.0],
  ["E2", 1000, 1.6], ["F1", 1000, 5.0], ["F2", 1000, 16], ["M1", 1000, 50],
  ["F1", 10000, 50], ["M1", 10000, 500],
] as const;
