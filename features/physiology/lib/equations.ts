/**
 * Metabolic and cardiac equations. VO2 in mL·kg⁻¹·min⁻¹ unless the name says otherwise.
 * Sources: ACSM's Guidelines for Exercise Testing and Prescription (metabolic equations); Tanaka, Monahan & Seals 2001;
 * Gellish et al. 2007; Karvonen, Kentala & Mustala 1957.
 */

export const ML_PER_MET = 3.5;
/** 1 W = 6.12 kg·m·min⁻¹ (ACSM). */
export const KGM_PER_MIN_PER_WATT = 6.12;

/** ACSM walking: VO2 = 0.1·S + 1.8·S·G + 3.5 (S in m/min, G as a fraction). */
export function acsmWalkingVo2(speedMMin: number, grade = 0): number {
  return 0.1 * speedMMin + 1.8 * speedMMin * grade + 3.5;
}

/** ACSM running: VO2 = 0.2·S + 0.9·S·G + 3.5. */
export function acsmRunningVo2(speedMMin: number, grade = 0): number {
  return 0.2 * speedMMin + 0.9 * speedMMin * grade + 3.5;
}

/** ACSM leg cycling: VO2 = 1.8·WR/M + 7 (WR in kg·m/min, M in kg). */
export function acsmCyclingVo2(powerW: number, massKg: number): number {
  return (1.8 * powerW * KGM_PER_MIN_PER_WATT) / massKg + 7;
}

/** ACSM arm ergometry: VO2 = 3·WR/M + 3.5 (WR in kg·m/min, M in kg). */
export function acsmArmVo2(powerW: number, massKg: number): number {
  return (3 * powerW * KGM_PER_MIN_PER_WATT) / massKg + 3.5;
}

/**
 * Where each ACSM equation is valid, as the Guidelines state it (ACSM's Guidelines for Exercise Testing and Prescription,
 * chapter on the metabolic calculations; the ranges from memory of the 10th edition's text): walking about 50–100 m/min,
 * running above about 134 m/min (or above 80 m/min when truly jogging), leg cycling about 50–200 W, arm ergometry about
 * 25–125 W.
 */
export const ACSM_VALID = {
  walking: { min: 50, max: 100, unit: "m/min" },
  running: { min: 134, max: Infinity, unit: "m/min" },
  cycling: { min: 50, max: 200, unit: "W" },
  arm: { min: 25, max: 125, unit: "W" },
} as const;

export function metsFromVo2(vo2MlKgMin: number): number {
  return vo2MlKgMin / ML_PER_MET;
}

export function kmhToMMin(speedKmh: number): number {
  return (speedKmh * 1000) / 60;
}

export type HrMaxFormula = "tanaka" | "gellish" | "traditional";

export const HR_MAX_FORMULAS: Record<HrMaxFormula, { label: string; of: (age: number) => number }> = {
  tanaka: { label: "Tanaka, Monahan & Seals 2001: 208 − 0.7 × age", of: (age) => 208 - 0.7 * age },
  gellish: { label: "Gellish et al. 2007: 207 − 0.7 × age", of: (age) => 207 - 0.7 * age },
  traditional: { label: "Traditional: 220 − age", of: (age) => 220 - age },
};

export function predictedHrMax(age: number, formula: HrMaxFormula = "tanaka"): number {
  return HR_MAX_FORMULAS[formula].of(age);
}

/** Heart-rate reserve (Karvonen 1957): rest + fraction × (max − rest). */
export function karvonenHr(restBpm: number, maxBpm: number, fraction: number): number {
  return restBpm + fraction * (maxBpm - restBpm);
}
