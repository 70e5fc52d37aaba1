/** Events that may bring an out-of-service instrument back; each resets the statistical baseline. */
export const RELEASE_EVENTS = ["repair", "adjustment", "calibration"] as const;
export type ReleaseEvent = (typeof RELEASE_EVENTS)[number];
