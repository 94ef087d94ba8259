/**
 * Throughput of predictElongation on a pour-sized batch, against a bare loop that evaluates the
 * same exponentials (one per segment) in the same run, so machine speed cancels out of the ratio.
 * Prints figures only; nothing here passes or fails.
 *
 *   npx tsx scripts/bench/elongation.ts
 */
import { predictElongation, type StressedEnds, type TendonInput } from "../../lib/elongation/index";
import { report } from "./harness";

const TENDONS = 100_000;
const SEGMENTS = 10;
const ROUNDS = 11;

// Small deterministic generator so every run times the same tendons.
function generator(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

function makeTendons(): TendonInput[] {
  const random = generator(20_250_601);
  const ends: StressedEnds[] = ["A", "B", "both"];
  const tendons: TendonInput[] = [];
  for (let t = 0; t < TENDONS; t++) {
    const segments = [];
    for (let s = 0; s < SEGMENTS; s++) {
      segments.push({ lengthMm: 1500 + random() * 4000, angleRad: random() * 0.15 });
    }
    tendons.push({
      segments,
      strandAreaMm2: 98.7,
      strandCount: 1 + Math.floor(random() * 4),
      modulusMPa: 196_500,
      jackingForceN: 140_000 + random() * 7_000,
      wobblePerM: 0.0033,
      mu: 0.07,
      anchorSetMm: 6,
      jackGripMm: 450,
      ends: ends[t % 3]!,
    });
  }
  return tendons;
}

function runEngine(tendons: readonly TendonInput[]): number {
  let checksum = 0;
  for (const tendon of tendons) checksum += predictElongation(tendon).netMm;
  return checksum;
}

/** The floor: walk the same segments and take e^-β of each, nothing else. */
function runBareLoop(tendons: readonly TendonInput[]): number {
  let checksum = 0;
  for (const tendon of tendons) {
    let force = tendon.jackingForceN;
    for (const segment of tendon.segments) {
      const beta = (tendon.wobblePerM * segment.lengthMm) / 1000 + tendon.mu * segment.angleRad;
      force *= Math.exp(-beta);
    }
    checksum += force;
  }
  return checksum;
}

function timeMs(run: () => number): { ms: number; checksum: number } {
  const start = performance.now();
  const checksum = run();
  return { ms: performance.now() - start, checksum };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

const tendons = makeTendons();
// Warm both paths up so the JIT has compiled them before anything is timed.
runEngine(tendons);
runBareLoop(tendons);

const engineMs: number[] = [];
const bareMs: number[] = [];
const ratios: number[] = [];
let sink = 0;
for (let round = 0; round < ROUNDS; round++) {
  // Back to back, in alternating order, so a burst of load from other processes falls on both
  // halves of a round; each round then gives its own ratio.
  const engineFirst = round % 2 === 0;
  const first = timeMs(() => (engineFirst ? runEngine(tendons) : runBareLoop(tendons)));
  const second = timeMs(() => (engineFirst ? runBareLoop(tendons) : runEngine(tendons)));
  const engine = engineFirst ? first : second;
  const bare = engineFirst ? second : first;
  engineMs.push(engine.ms);
  bareMs.push(bare.ms);
  ratios.push(engine.ms / bare.ms);
  sink += engine.checksum + bare.checksum;
}

const perTendon = (ms: number): string => `${((ms * 1e6) / TENDONS).toFixed(0)} ns per tendon`;
const engine = median(engineMs);
const bare = median(bareMs);
console.log(`tendons: ${TENDONS}, segments each: ${SEGMENTS}, anchor set: yes, ends: A/B/both in turn`);
console.log(`rounds: ${ROUNDS}, engine and bare loop back to back in each (median shown)`);
console.log(`engine:    ${engine.toFixed(1)} ms  (${perTendon(engine)})`);
console.log(`bare loop: ${bare.toFixed(1)} ms  (${perTendon(bare)})`);
console.log(
  `ratio engine / bare loop: ${median(ratios).toFixed(2)} median of rounds ` +
    `(range ${Math.min(...ratios).toFixed(2)}–${Math.max(...ratios).toFixed(2)}; target 3.00 or less)`,
);
report({
  figure: "elongation engine / bare loop of the same exponentials",
  value: `${median(ratios).toFixed(2)} (${perTendon(engine)})`,
  target: "≤ 3.00",
  holds: median(ratios) <= 3,
});
console.log(`checksum (keeps the work from being optimised away): ${sink.toExponential(6)}`);
