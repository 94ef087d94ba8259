import { describe, expect, it } from "vitest";
import { boardStatusText, pourBoardStatus } from "./pour-status";

const counts = { released: false, tendons: 10, started: 0, complete: 0, held: 0 };

describe("pourBoardStatus", () => {
  it("walks planned → stressing → stressed → released", () => {
    expect(pourBoardStatus(counts).status).toBe("planned");
    expect(pourBoardStatus({ ...counts, started: 3, complete: 2 }).status).toBe("stressing");
    expect(pourBoardStatus({ ...counts, started: 10, complete: 9 }).status).toBe("stressing");
    expect(pourBoardStatus({ ...counts, started: 10, complete: 10 }).status).toBe("stressed");
    expect(pourBoardStatus({ ...counts, started: 10, complete: 10, released: true }).status).toBe("released");
  });

  it("holds a pour with open flags, with their count, whatever else is done", () => {
    const held = pourBoardStatus({ ...counts, started: 10, complete: 10, held: 2 });
    expect(held).toEqual({ status: "held", held: 2 });
    expect(boardStatusText(held)).toBe("Held: 2 tendons with an open flag");
    expect(boardStatusText(pourBoardStatus({ ...counts, started: 1, held: 1 }))).toBe(
      "Held: 1 tendon with an open flag",
    );
  });

  it("never calls a pour with no tendons stressed", () => {
    expect(pourBoardStatus({ ...counts, tendons: 0, started: 0 }).status).toBe("planned");
  });
});
