import type { PourStatus } from "@/lib/schemas/domain";

/**
 * A pour's state on the status board, from its counts alone (pure, so the office screens, the
 * shared board and the tests agree): released once released; held while any tendon has an open
 * flag (with how many); planned before any record; stressing until every tendon has every end read;
 * then stressed.
 */
export type BoardStatus = PourStatus | "held";

export interface PourCounts {
  released: boolean;
  tendons: number;
  /** Tendons with at least one stressing record. */
  started: number;
  /** Tendons whose latest evaluation has every scheduled end read. */
  complete: number;
  /** Tendons with at least one flag not closed. */
  held: number;
}

export function pourBoardStatus(c: PourCounts): { status: BoardStatus; held: number } {
  if (c.released) return { status: "released", held: 0 };
  if (c.held > 0) return { status: "held", held: c.held };
  if (c.started === 0) return { status: "planned", held: 0 };
  if (c.tendons > 0 && c.complete >= c.tendons) return { status: "stressed", held: 0 };
  return { status: "stressing", held: 0 };
}

export function boardStatusText(s: { status: BoardStatus; held: number }): string {
  switch (s.status) {
    case "held":
      return `Held: ${s.held} tendon${s.held === 1 ? "" : "s"} with an open flag`;
    case "planned":
      return "Planned";
    case "stressing":
      return "Stressing";
    case "stressed":
      return "Stressed, not yet released";
    case "released":
      return "Released";
  }
}
