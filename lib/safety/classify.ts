// Hazard class check (1, 1M, 2, 2M, 3R, 3B, 4) of a single-wavelength, point-source beam from its accessible emission, and the label comparison.
// Limits: IEC 60825-1:2014 Tables 3–8 (class AELs) and Table 10 (measurement conditions), as recalled; see APPLIED_CONDITIONS for choices made.

import { correctionCA, correctionCB, correctionCC } from "./mpe";
import { pulsedEyeMpe } from "./pulsed";
import { type HazardClass, SOURCE, classRank } from "./types";

/** How the engine measures the accessible emission; stated in every result. */
export const APPLIED_CONDITIONS = {
  reference:
    "The beam is taken to leave the laser at its 1/e² waist with the stated diameter and to spread as D(z) = √(D₀² + (φz)²).",
  condition1:
    "Condition 1 (optical aids such as binoculars), 302.5–4000 nm: 50 mm aperture at 2000 mm (IEC 60825-1:2014 Table 10; used at all those wavelengths, the larger recalled aperture).",
  condition3:
    "Condition 3 (unaided eye): 7 mm aperture at 100 mm in 302.5–4000 nm (IEC 60825-1:2014 Table 10); outside that range 7 mm (11 mm beyond 0.1 mm) at the exit — larger or nearer than the recalled IEC value, so at least as strict.",
  class3B: "Class 3B vs 4 compares the total emitted power (no aperture), the strictest reading.",
  timeBases:
    "Time bases: 0.25 s for Class 2 and 2M; 100 s for Classes 1, 1M, 3R, 3B from 400 nm up; 30 000 s below 400 nm (IEC 60825-1:2014 §4.3).",
} as const;

export type ClassInput = {
  wavelengthNm: number;
  /** CW power, or average power of a pulse train. */
  powerMw: number;
  /** 1/e² diameter at the exit. */
  beamDiameterMm: number;
  /** 1/e² full-angle divergence. */
  divergenceMrad: number;
  pulseDurationS?: number;
  pulseRepetitionRateHz?: number;
};

export type AccessibleEmission = { condition: "1" | "3"; apertureMm: number; distanceMm: number; powerMw: number; fraction: number };

export type ClassLimits = {
  /** Average-power limits in mW; null where the class does not exist at this wavelength. */
  class1Mw: number;
  class2Mw: number | null;
  class3RMw: number;
  class3BMw: number;
  /** Per-pulse energy limits in mJ (pulsed lasers only). */
  class1PulseMj: number | null;
  class3BPulseMj: number | null;
};

export type Classification = {
  hazardClass: HazardClass;
  limits: ClassLimits;
  accessibleEmission: AccessibleEmission[];
  /** Pulse energy in mJ for pulsed lasers. */
  pulseEnergyMj: number | null;
  reasons: string[];
  conditions: typeof APPLIED_CONDITIONS;
  source: string;
};

/** Beam 1/e² diameter at distance z from the waist. */
function diameterAtMm(d0Mm: number, divergenceMrad: number, zMm: number): number {
  return Math.hypot(d0Mm, (divergenceMrad / 1000) * zMm);
}

function fractionThrough(apertureMm: number, beamDiameterMm: number): number {
  return -Math.expm1((-2 * apertureMm * apertureMm) / (beamDiameterMm * beamDiameterMm));
}

const BAND_EDGES_NM = [302.5, 315, 400, 1400];

/**
 * IEC 60825-1:2014 Class 1 AEL for a CW point source at its time base, in mW (recalled; C6 = 1).
 * Exactly at a band edge the lower of the two neighbouring rows applies.
 */
export function class1AelMw(wavelengthNm: number): number {
  if (BAND_EDGES_NM.includes(wavelengthNm)) return Math.min(class1Row(wavelengthNm), class1Row(wavelengthNm - 1e-6));
  return class1Row(wavelengthNm);
}

function class1Row(λ: number): number {
  // 180–302.5 nm: 2.4×10⁻⁵ J over the 30 000 s time base.
  if (λ < 302.5) return (2.4e-5 / 3e4) * 1e3;
  // 302.5–315 nm: 7.9×10⁻⁷ C2 J, C2 = 10^(0.2(λ−295)), over 30 000 s.
  if (λ < 315) return ((7.9e-7 * 10 ** (0.2 * (λ - 295))) / 3e4) * 1e3;
  // 315–400 nm, 10³–3×10⁴ s: 7.9×10⁻⁶ W.
  if (λ < 400) return 7.9e-3;
  if (λ < 1400) {
    // Thermal, t ≥ T2: 3.9×10⁻⁴ C4 C7 W (C4 = C_A, C7 = C_C); photochemical 400–600 nm at 100 s: 3.9×10⁻⁵ C3 W (C3 = C_B).
    const thermal = 3.9e-4 * correctionCA(λ) * correctionCC(λ) * 1e3;
    if (λ <= 600) return Math.min(thermal, 3.9e-5 * correctionCB(λ) * 1e3);
    return thermal;
  }
  // 1400 nm – 1 mm, t > 10 s: 1×10⁻² W.
  return 10;
}

/** IEC 60825-1:2014 Class 3B AEL for CW emission in mW (recalled). */
export function class3BAelMw(wavelengthNm: number): number {
  // Below 315 nm 1.5 mW; the recalled 302.5–315 nm value was uncertain, so the stricter 1.5 mW is used there too.
  if (wavelengthNm < 315) return 1.5;
  return 500;
}

function isVisible(wavelengthNm: number): boolean {
  return wavelengthNm >= 400 && wavelengthNm <= 700;
}

export function classLimits(wavelengthNm: number, pulsed?: { pulseDurationS: number; pulseRepetitionRateHz?: number }): ClassLimits {
  const class1Mw = class1AelMw(wavelengthNm);
  const class2Mw = isVisible(wavelengthNm) ? 1 : null;
  let class1PulseMj: number | null = null;
  let class3BPulseMj: number | null = null;
  if (pulsed) {
    // Per-pulse Class 1 limit: the governing per-pulse MPE at the Class 1 time base × the 7 mm aperture area —
    // the way IEC builds its retinal Class 1 AELs for a point source. Outside 400–1400 nm the 7 mm area over-states
    // the recalled IEC aperture, which makes the limit larger; the UV/IR pulse check is therefore marked approximate.
    const timeBase = wavelengthNm < 400 ? 3e4 : 100;
    const perPulse = pulsedEyeMpe({
      wavelengthNm,
      pulseDurationS: pulsed.pulseDurationS,
      pulseRepetitionRateHz: pulsed.pulseRepetitionRateHz,
      exposureS: pulsed.pulseRepetitionRateHz === undefined ? pulsed.pulseDurationS : timeBase,
    }).perPulseJPerCm2;
    const area7mmCm2 = Math.PI * 0.35 * 0.35;
    class1PulseMj = perPulse * area7mmCm2 * 1e3;
    // Class 3B per pulse: 0.03 C4 J in 400–1400 nm (recalled); 0.03 J elsewhere as the conservative choice.
    const c4 = wavelengthNm >= 400 && wavelengthNm <= 1400 ? correctionCA(wavelengthNm) : 1;
    class3BPulseMj = 30 * c4;
  }
  return {
    class1Mw,
    class2Mw,
    class3RMw: class2Mw !== null ? 5 * class2Mw : 5 * class1Mw,
    class3BMw: class3BAelMw(wavelengthNm),
    class1PulseMj,
    class3BPulseMj,
  };
}

/**
 * The class the accessible emission falls in. The lowest class whose limits the emission meets, in IEC order
 * 1, 1M, 2, 2M, 3R, 3B, 4. Class 1M/2M need Condition 3 (unaided eye) within the limit while Condition 1
 * (optical aids) exceeds it.
 */
export function classifyBeam(input: ClassInput): Classification {
  const λ = input.wavelengthNm;
  const P = input.powerMw;
  const pulsed = input.pulseDurationS !== undefined;
  const limits = classLimits(
    λ,
    pulsed ? { pulseDurationS: input.pulseDurationS as number, pulseRepetitionRateHz: input.pulseRepetitionRateHz } : undefined,
  );
  const reasons: string[] = [];
  const condition1Applies = λ >= 302.5 && λ <= 4000;

  const measure = (condition: "1" | "3", apertureMm: number, distanceMm: number): AccessibleEmission => {
    const d = diameterAtMm(input.beamDiameterMm, input.divergenceMrad, distanceMm);
    const fraction = fractionThrough(apertureMm, d);
    return { condition, apertureMm, distanceMm, powerMw: P * fraction, fraction };
  };
  const cond3 = condition1Applies ? measure("3", 7, 100) : measure("3", λ > 1e5 ? 11 : 7, 0);
  const accessibleEmission = [cond3];
  if (condition1Applies) accessibleEmission.push(measure("1", 50, 2000));
  const cond1 = accessibleEmission.find((a) => a.condition === "1") ?? cond3;
  const ae3 = cond3.powerMw;
  const aeMax = Math.max(ae3, cond1.powerMw);

  // For a single pulse the stated power is the power during the pulse; for a train it is the average power.
  const pulseEnergyMj = pulsed
    ? input.pulseRepetitionRateHz === undefined
      ? P * (input.pulseDurationS as number)
      : P / input.pulseRepetitionRateHz
    : null;
  // A pulse through an aperture scales with the same fraction as the average power.
  const pulseScale = (fraction: number) => (pulseEnergyMj === null ? 0 : pulseEnergyMj * fraction);
  const pulseCond3 = pulseScale(cond3.fraction);
  const pulseMax = Math.max(pulseCond3, pulseScale(cond1.fraction));
  const avgOk = (limitMw: number, ae: number) => ae <= limitMw;
  const pulseOk = (factor: number, ae: number) => limits.class1PulseMj === null || ae <= factor * limits.class1PulseMj;
  // A train with an undefined average (single pulse) is judged by its pulse alone.
  const avgFor = (ae: number) => (pulsed && input.pulseRepetitionRateHz === undefined ? 0 : ae);

  const finish = (hazardClass: HazardClass, reason: string): Classification => {
    reasons.push(reason);
    return {
      hazardClass,
      limits,
      accessibleEmission,
      pulseEnergyMj,
      reasons,
      conditions: APPLIED_CONDITIONS,
      source: `${SOURCE.iecAel}; ${SOURCE.iecConditions}`,
    };
  };

  const total = avgFor(P);
  if (total > limits.class3BMw) return finish("4", `Total power ${fmt(P)} mW exceeds the Class 3B limit ${fmt(limits.class3BMw)} mW.`);
  if (pulseEnergyMj !== null && limits.class3BPulseMj !== null && pulseEnergyMj > limits.class3BPulseMj) {
    return finish("4", `Pulse energy ${fmt(pulseEnergyMj)} mJ exceeds the Class 3B per-pulse limit ${fmt(limits.class3BPulseMj)} mJ.`);
  }
  if (avgOk(limits.class1Mw, avgFor(aeMax)) && pulseOk(1, pulseMax)) {
    return finish("1", `Accessible emission ${fmt(aeMax)} mW is within the Class 1 limit ${fmt(limits.class1Mw)} mW under every condition.`);
  }
  if (condition1Applies && avgOk(limits.class1Mw, avgFor(ae3)) && pulseOk(1, pulseCond3)) {
    return finish("1M", `Within the Class 1 limit for the unaided eye (Condition 3: ${fmt(ae3)} mW) but not with optical aids (Condition 1: ${fmt(cond1.powerMw)} mW).`);
  }
  // Class 2: visible only; pulses must still meet the Class 1 per-pulse limit.
  if (limits.class2Mw !== null) {
    if (avgOk(limits.class2Mw, avgFor(aeMax)) && pulseOk(1, pulseMax)) {
      return finish("2", `Visible emission ${fmt(aeMax)} mW is within the Class 2 limit ${fmt(limits.class2Mw)} mW under every condition.`);
    }
    if (condition1Applies && avgOk(limits.class2Mw, avgFor(ae3)) && pulseOk(1, pulseCond3)) {
      return finish("2M", `Within the Class 2 limit for the unaided eye (Condition 3: ${fmt(ae3)} mW) but not with optical aids (Condition 1: ${fmt(cond1.powerMw)} mW).`);
    }
  }
  if (avgOk(limits.class3RMw, avgFor(aeMax)) && pulseOk(5, pulseMax)) {
    return finish("3R", `Accessible emission ${fmt(aeMax)} mW is within the Class 3R limit ${fmt(limits.class3RMw)} mW.`);
  }
  return finish("3B", `Above the Class 3R limit ${fmt(limits.class3RMw)} mW and within the Class 3B limit ${fmt(limits.class3BMw)} mW.`);
}

export type LabelCheck = {
  labelClass: HazardClass;
  computedClass: HazardClass;
  matches: boolean;
  /** Present when the label and the computed class differ; the label is never changed by the engine. */
  warning: string | null;
};

export function compareLabel(labelClass: HazardClass, computedClass: HazardClass): LabelCheck {
  if (labelClass === computedClass) return { labelClass, computedClass, matches: true, warning: null };
  const direction =
    classRank(computedClass) > classRank(labelClass)
      ? "The estimate is HIGHER than the label: treat the laser as the higher class until the safety officer decides."
      : "The estimate is lower than the label: keep the controls of the labelled class until the safety officer decides.";
  return {
    labelClass,
    computedClass,
    matches: false,
    warning: `The label says Class ${labelClass}; from the stated power and beam the engine estimates Class ${computedClass}. ${direction} The label has not been changed; the laser safety officer should check the datasheet or a measurement.`,
  };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
