/** The verdicts' marks on the insight charts and the points they draw; no drawing code here. */

export interface DeviationPoint {
  index: number;
  tag: string;
  deviationPct: number;
  verdict: "in band" | "long" | "short";
  provisional: boolean;
}

export const VERDICT_MARKS = {
  "in band": { name: "In band (circle)", shape: "circle", colour: "#1d6b3a" },
  long: { name: "Long (triangle)", shape: "triangle", colour: "#8a4b00" },
  short: { name: "Short (square)", shape: "square", colour: "#1f4e99" },
} as const;

/** A tendon on the measured-against-predicted chart: the values in the display unit, and as printed. */
export interface ElongationPoint {
  tag: string;
  predicted: number;
  measured: number;
  predictedText: string;
  measuredText: string;
  verdict: "in band" | "long" | "short";
}

/** What the measured-against-predicted chart draws: the tendons, the band and the unit shown. */
export interface MeasuredPredictedData {
  points: ElongationPoint[];
  tolerancePct: number;
  unit: string;
}
