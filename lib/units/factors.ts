/**
 * Exact conversion factors to the SI base units used inside Tautline (mm, mm², N, MPa, rad,
 * wobble per metre). Each is the defined value (international inch and pound of 1959), so a
 * value converted out and back returns to itself within floating-point rounding.
 */
export const MM_PER_INCH = 25.4;
export const MM_PER_FOOT = 304.8;
export const MM2_PER_IN2 = 645.16;
/** 1 ft² = 0.3048² m² exactly (a pour's area). */
export const M2_PER_FT2 = 0.09290304;
/** 1 lbf = 0.45359237 kg × 9.80665 m/s². */
export const N_PER_LBF = 4.4482216152605;
export const N_PER_KIP = 4448.2216152605;
/** 1 psi = 1 lbf / in²; written out rather than divided so no rounding creeps in. */
export const MPA_PER_PSI = 0.006894757293168;
export const MPA_PER_KSI = 6.894757293168;
export const MPA_PER_BAR = 0.1;
export const METRES_PER_FOOT = 0.3048;

export const inToMm = (inches: number): number => inches * MM_PER_INCH;
export const mmToIn = (mm: number): number => mm / MM_PER_INCH;
export const ftToMm = (feet: number): number => feet * MM_PER_FOOT;
export const mmToFt = (mm: number): number => mm / MM_PER_FOOT;
export const in2ToMm2 = (in2: number): number => in2 * MM2_PER_IN2;
export const mm2ToIn2 = (mm2: number): number => mm2 / MM2_PER_IN2;
export const ft2ToM2 = (ft2: number): number => ft2 * M2_PER_FT2;
export const m2ToFt2 = (m2: number): number => m2 / M2_PER_FT2;

export const lbfToN = (lbf: number): number => lbf * N_PER_LBF;
export const nToLbf = (n: number): number => n / N_PER_LBF;
export const kipToN = (kip: number): number => kip * N_PER_KIP;
export const nToKip = (n: number): number => n / N_PER_KIP;
export const kNToN = (kN: number): number => kN * 1000;
export const nToKN = (n: number): number => n / 1000;

export const psiToMPa = (psi: number): number => psi * MPA_PER_PSI;
export const mpaToPsi = (mpa: number): number => mpa / MPA_PER_PSI;
export const ksiToMPa = (ksi: number): number => ksi * MPA_PER_KSI;
export const mpaToKsi = (mpa: number): number => mpa / MPA_PER_KSI;
export const barToMPa = (bar: number): number => bar * MPA_PER_BAR;
export const mpaToBar = (mpa: number): number => mpa / MPA_PER_BAR;

/** Wobble K is "per unit length", so per-foot values get larger per metre (×3.2808…). */
export const wobblePerFtToPerM = (perFt: number): number => perFt / METRES_PER_FOOT;
export const wobblePerMToPerFt = (perM: number): number => perM * METRES_PER_FOOT;

export const degToRad = (deg: number): number => (deg * Math.PI) / 180;
export const radToDeg = (rad: number): number => (rad * 180) / Math.PI;
