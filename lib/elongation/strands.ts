import { in2ToMm2, inToMm, ksiToMPa, lbfToN } from "../units/factors";

export interface StrandSize {
  designation: string;
  nominalDiameterIn: number;
  areaIn2: number;
  minBreakingStrengthLbf: number;
  /** The same figures in SI, converted from the inch-pound values above. */
  nominalDiameterMm: number;
  areaMm2: number;
  minBreakingStrengthN: number;
}

function strand(designation: string, diameterIn: number, areaIn2: number, breakingLbf: number): StrandSize {
  return {
    designation,
    nominalDiameterIn: diameterIn,
    areaIn2,
    minBreakingStrengthLbf: breakingLbf,
    nominalDiameterMm: inToMm(diameterIn),
    areaMm2: in2ToMm2(areaIn2),
    minBreakingStrengthN: lbfToN(breakingLbf),
  };
}

/**
 * Nominal properties of ASTM A416 Grade 270 low-relaxation seven-wire strand (A416 Tables 1 and
 * 2). Breaking strength is fpu times the nominal area. Mill certificates give the actual area
 * and modulus of each lot and override these.
 */
export const ASTM_A416_GRADE_270: readonly StrandSize[] = [
  strand("0.375 in", 0.375, 0.085, 23_000),
  // Designated 0.438 in; the diameter is 7/16 in, which is what the printed 11.11 mm comes from.
  strand("0.438 in", 0.4375, 0.115, 31_000),
  strand("0.5 in", 0.5, 0.153, 41_300),
  strand("0.6 in", 0.6, 0.217, 58_600),
];

/** Ultimate strength of Grade 270 strand, MPa (270 ksi; the SI grade is written 1860). */
export const GRADE_270_FPU_MPA = ksiToMPa(270);

/**
 * Default strand moduli when no mill certificate is linked: 28,500 ksi per AASHTO LRFD §5.4.4.2
 * and 195 GPa per EN 1992-1-1 §3.3.6 (both from memory; the mill certificate governs).
 */
export const DEFAULT_STRAND_MODULUS_MPA = {
  aashto: ksiToMPa(28_500),
  eurocode: 195_000,
} as const;

export function findStrandSize(designation: string): StrandSize | undefined {
  return ASTM_A416_GRADE_270.find((size) => size.designation === designation);
}
