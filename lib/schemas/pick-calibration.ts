// No zod here: the tablet's tendon list imports this without the schemas' validation code.

/** What a set's calibration needs for it to be picked for a day. */
export interface PickableCalibration {
  id: string;
  calibratedOn: string;
  /** Set when the calibration was retired: it is never picked again. */
  retiredAt?: string | Date | null;
}

/**
 * The calibration in force on a stressing day: the latest one made on or before that day and not
 * retired. The tablet (`lib/offline/tendon-view.ts`) and the server's evaluation both call this, so
 * office and field always pick the same one, whatever order the list comes in (two on the same day:
 * the greater id, so the choice never depends on the order rows were read).
 */
export function pickCalibration<C extends PickableCalibration>(calibrations: readonly C[], day: string): C | null {
  let best: C | null = null;
  for (const c of calibrations) {
    if (c.retiredAt || c.calibratedOn > day) continue;
    if (!best || c.calibratedOn > best.calibratedOn || (c.calibratedOn === best.calibratedOn && c.id > best.id))
      best = c;
  }
  return best;
}
