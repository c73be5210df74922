// Hazard class (1, 1M, 2, 2M, 3R, 3B, 4) of a single-wavelength, point-source beam, CW or pulsed, and the label comparison.
// Limits: IEC 60825-1:2014 Tables 3–8 (class AELs, per pulse and average) and Table 10 (conditions 1 and 3), all from memory.

// Every AEL and measurement condition here was written from memory of IEC 60825-1:2014 (the text could not be read).
// Construction (from memory, consistent with the tabulated values recalled for checking, e.g. 7.7×10⁻⁸ J, 2.4×10⁻⁵ J,
// 8×10⁻⁴ J, 3.9×10⁻⁴ W): a Class 1 per-pulse AEL is the point-source MPE (rules 1 and 3 over the class time base)
// times the area of the limiting aperture (7 mm on the retina; 1 mm in the UV; 1 mm → 1.5 t^0.375 → 3.5 mm in the
// IR, knee 0.35 s; 11 mm beyond 0.1 mm). Class 1 average limits are the tabulated CW values. Class 3R is 5 × Class 1
// (5 × Class 2 in 400–700 nm). Class 3B is compared with the total emission (no aperture), the strictest reading.

import { correctionCA, correctionCB, correctionCC, limitingAperture, type MpeSite } from "./mpe";
import { pulsedEyeMpe } from "./pulsed";
import { type HazardClass, SOURCE, UNCHECKED, classRank } from "./types";

/** How the engine measures the accessible emission; stated in every result. */
export const APPLIED_CONDITIONS = {
  reference:
    "The beam is taken to leave the laser at its 1/e² waist with the stated diameter and to spread as D(z) = √(D₀² + (φz)²).",
  condition1:
    "Condition 1 (optical aids such as binoculars), IEC 60825-1:2014 Table 10: 50 mm aperture at 2000 mm in 400–1400 nm; 7 mm (or the limiting aperture, if larger) at 2000 mm in 302.5–400 nm and 1400–4000 nm; not applied below 302.5 nm or from 4000 nm.",
  condition3:
    "Condition 3 (unaided eye), IEC 60825-1:2014 Table 10: 7 mm at 100 mm in 400–1400 nm; the limiting aperture (1 mm in the UV; 1 mm → 1.5 t^0.375 mm → 3.5 mm in the IR) at 100 mm in 302.5–4000 nm, and at the exit below 302.5 nm and from 4000 nm (11 mm beyond 0.1 mm).",
  class3B: "Class 3B vs 4 compares the total emitted power and pulse energy (no aperture), the strictest reading.",
  timeBases:
    "Time bases (IEC 60825-1:2014 §4.3 e): 0.25 s for Class 2, 2M and 3R in 400–700 nm; 30 000 s below 400 nm; 100 s otherwise.",
  pulses:
    "Pulsed emission: every pulse (rule 1), the average over the time base (rule 2) and each pulse of the train with C5 = N^−0.25 (rule 3, the conservative reading) must meet the class limit; the worst ratio decides.",
  unchecked: `Every limit and condition here is ${UNCHECKED}.`,
} as const;

export type ClassInput = {
  wavelengthNm: number;
  /** CW power, or average power of a pulse train (omitted for a single pulse given by pulseEnergyJ). */
  powerMw?: number;
  pulseEnergyJ?: number;
  /** 1/e² diameter at the exit. */
  beamDiameterMm: number;
  /** 1/e² full-angle divergence. */
  divergenceMrad: number;
  pulseDurationS?: number;
  /** For bursts, the average number of pulses per second. */
  pulseRepetitionRateHz?: number;
  /** Trains in bursts: pulses per burst and the pulse rate inside a burst (both, or neither). */
  pulsesPerBurst?: number;
  burstPulseRateHz?: number;
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

/** The worst accessible-emission ÷ limit ratio for each class: under every condition, and under Condition 3 only. */
export type ClassRatios = Record<"1" | "2" | "3R" | "3B", { all: number; condition3: number }>;

export type Classification = {
  hazardClass: HazardClass;
  limits: ClassLimits;
  accessibleEmission: AccessibleEmission[];
  /** Pulse energy in mJ for pulsed lasers. */
  pulseEnergyMj: number | null;
  /** Average power in mW; null for a single pulse. */
  averagePowerMw: number | null;
  ratios: ClassRatios;
  /** Which limit gave the deciding ratio. */
  governingLimit: string;
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
 * IEC 60825-1:2014 Class 1 AEL for a CW point source at its time base, in mW (Table 3, from memory; C6 = 1).
 * Exactly at a band edge the lower of the two neighbouring rows applies.
 */
export function class1AelMw(wavelengthNm: number): number {
  if (BAND_EDGES_NM.includes(wavelengthNm)) return Math.min(class1Row(wavelengthNm), class1Row(wavelengthNm - 1e-6));
  return class1Row(wavelengthNm);
}

function class1Row(λ: number): number {
  return Math.min(...[retinalClass1Mw(λ), anteriorClass1Mw(λ)].filter((x): x is number => x !== null));
}

/** Retinal Class 1 CW AEL (400–1400 nm), mW: thermal 3.9×10⁻⁴ C4 C7 W; photochemical 400–600 nm 3.9×10⁻⁵ C3 W at 100 s. */
function retinalClass1Mw(λ: number): number | null {
  if (λ < 400 || λ > 1400) return null;
  const thermal = 3.9e-4 * correctionCA(λ) * correctionCC(λ) * 1e3;
  return λ <= 600 ? Math.min(thermal, 3.9e-5 * correctionCB(λ) * 1e3) : thermal;
}

/** Corneal/lens Class 1 CW AEL, mW: UV rows over 30 000 s; 10⁻² W from 1400 nm (also the 1200–1400 nm dual limit). */
function anteriorClass1Mw(λ: number): number | null {
  // 180–302.5 nm: 2.4×10⁻⁵ J over the 30 000 s time base.
  if (λ < 302.5) return (2.4e-5 / 3e4) * 1e3;
  // 302.5–315 nm: 7.9×10⁻⁷ C2 J, C2 = 10^(0.2(λ−295)), over 30 000 s.
  if (λ < 315) return ((7.9e-7 * 10 ** (0.2 * (λ - 295))) / 3e4) * 1e3;
  // 315–400 nm, 10³–3×10⁴ s: 7.9×10⁻⁶ W.
  if (λ <= 400) return 7.9e-3;
  if (λ >= 1200) return 10;
  return null;
}

/** IEC 60825-1:2014 Class 3B AEL for CW emission (t ≥ 0.25 s) in mW (Table 8, from memory). */
export function class3BAelMw(wavelengthNm: number): number {
  const row = (λ: number) => (λ < 302.5 ? 1.5 : λ < 315 ? 5e-5 * 10 ** (0.2 * (λ - 295)) * 1e3 : 500);
  return BAND_EDGES_NM.includes(wavelengthNm) ? Math.min(row(wavelengthNm), row(wavelengthNm - 1e-6)) : row(wavelengthNm);
}

/**
 * IEC 60825-1:2014 Class 3B AEL for one pulse of duration τ, in J (Table 8, from memory): below 1 ns a peak power, from
 * 1 ns to 0.25 s an energy, beyond 0.25 s the CW power limit held over the pulse.
 */
export function class3BPulseAelJ(wavelengthNm: number, pulseDurationS: number): { energyJ: number; row: string } {
  const at = (λ: number) => {
    const τ = pulseDurationS;
    const c2 = 10 ** (0.2 * (λ - 295));
    const c4 = correctionCA(λ);
    const [peakW, energyJ, band] =
      λ < 302.5
        ? [3.8e5, 3.8e-4, "180–302.5 nm: 3.8×10⁵ W (< 1 ns), 3.8×10⁻⁴ J (1 ns–0.25 s)"]
        : λ < 315
          ? [1.25e4 * c2, 1.25e-5 * c2, "302.5–315 nm: 1.25×10⁴ C2 W (< 1 ns), 1.25×10⁻⁵ C2 J (1 ns–0.25 s)"]
          : λ < 400
            ? [1.25e8, 0.125, "315–400 nm: 1.25×10⁸ W (< 1 ns), 0.125 J (1 ns–0.25 s)"]
            : λ < 700
              ? [3e7, 0.03, "400–700 nm: 3×10⁷ W (< 1 ns), 0.03 J (1 ns–0.25 s)"]
              : λ < 1050
                ? [3e7 * c4, 0.03 * c4, "700–1050 nm: 3×10⁷ C4 W (< 1 ns), 0.03 C4 J (1 ns–0.25 s)"]
                : λ < 1400
                  ? [1.5e8, 0.15, "1050–1400 nm: 1.5×10⁸ W (< 1 ns), 0.15 J (1 ns–0.25 s)"]
                  : [1.25e8, 0.125, "1400 nm – 1 mm: 1.25×10⁸ W (< 1 ns), 0.125 J (1 ns–0.25 s)"];
    if (τ < 1e-9) return { energyJ: peakW * τ, row: band };
    if (τ <= 0.25) return { energyJ, row: band };
    return { energyJ: (class3BAelMw(λ) / 1e3) * τ, row: `${band}; beyond 0.25 s the CW limit` };
  };
  if (BAND_EDGES_NM.includes(wavelengthNm) || wavelengthNm === 700 || wavelengthNm === 1050) {
    const a = at(wavelengthNm);
    const b = at(wavelengthNm - 1e-6);
    return a.energyJ <= b.energyJ ? a : b;
  }
  return at(wavelengthNm);
}

function isVisible(wavelengthNm: number): boolean {
  return wavelengthNm >= 400 && wavelengthNm <= 700;
}

/**
 * The sites whose class limits apply: the retina in 400–1400 nm; the cornea/lens below 400 nm and from 1200 nm. At
 * 400 nm the retinal (visible) rows apply, with the Class 1 limit the lower of the two neighbouring rows.
 */
function sitesAt(λ: number): MpeSite[] {
  const sites: MpeSite[] = [];
  if (λ >= 400 && λ <= 1400) sites.push("retina");
  if (λ < 400 || λ >= 1200) sites.push("anterior");
  return sites;
}

type Geometry = { cond3: { apertureMm: number; distanceMm: number }; cond1: { apertureMm: number; distanceMm: number } | null };

/** IEC 60825-1:2014 Table 10 (from memory) for a site and an emission duration t (which sets the IR aperture). */
function geometry(λ: number, site: MpeSite, t: number): Geometry {
  const ap = limitingAperture(λ, t, "eye", "IEC 60825-1:2014", site).diameterMm;
  if (site === "retina") return { cond3: { apertureMm: 7, distanceMm: 100 }, cond1: { apertureMm: 50, distanceMm: 2000 } };
  if (λ < 302.5 || λ >= 4000) return { cond3: { apertureMm: ap, distanceMm: 0 }, cond1: null };
  return { cond3: { apertureMm: ap, distanceMm: 100 }, cond1: { apertureMm: Math.max(7, ap), distanceMm: 2000 } };
}

/** Area of a circular aperture in cm². */
const areaCm2 = (diameterMm: number) => Math.PI * (diameterMm / 20) ** 2;

export type PulseTiming = { pulseDurationS: number; pulseRepetitionRateHz?: number };

/** Per-call memo of class1PulseAelJ: the Class 1, 2 and 3R checks and the reported limits share most of their inputs. */
type AelMemo = Map<string, { energyJ: number; rule: string }>;

function class1PulseAelJ(λ: number, site: MpeSite, pulse: PulseTiming, timeBaseS: number, memo?: AelMemo): { energyJ: number; rule: string } {
  const key = `${site}|${timeBaseS}`;
  const hit = memo?.get(key);
  if (hit) return hit;
  const value = class1PulseAelJUncached(λ, site, pulse, timeBaseS);
  memo?.set(key, value);
  return value;
}

/** Class 1 per-pulse AEL in J for one site: the lower of rules 1 and 3 over the time base, × the limiting aperture area. */
function class1PulseAelJUncached(λ: number, site: MpeSite, pulse: PulseTiming, timeBaseS: number): { energyJ: number; rule: string } {
  const p = pulsedEyeMpe({
    wavelengthNm: λ,
    pulseDurationS: pulse.pulseDurationS,
    pulseRepetitionRateHz: pulse.pulseRepetitionRateHz,
    exposureS: Math.max(timeBaseS, pulse.pulseDurationS),
    standard: "IEC 60825-1:2014",
    site,
    explain: false,
  });
  let best = p.rules[0];
  for (const r of p.rules) if (r.rule !== "average-power" && r.perPulseJPerCm2 < best.perPulseJPerCm2) best = r;
  const apertureMm = limitingAperture(λ, pulse.pulseDurationS, "eye", "IEC 60825-1:2014", site).diameterMm;
  return { energyJ: best.perPulseJPerCm2 * areaCm2(apertureMm), rule: best.rule };
}

function timeBaseS(λ: number, forClass: "1" | "2" | "3R"): number {
  if (λ < 400) return 3e4;
  if (isVisible(λ) && forClass !== "1") return 0.25;
  return 100;
}

export function classLimits(wavelengthNm: number, pulsed?: PulseTiming, memo?: AelMemo): ClassLimits {
  const λ = wavelengthNm;
  const class1Mw = class1AelMw(λ);
  const class2Mw = isVisible(λ) ? 1 : null;
  let class1PulseMj: number | null = null;
  let class3BPulseMj: number | null = null;
  if (pulsed) {
    const values = sitesAt(λ).map((site) => class1PulseAelJ(λ, site, pulsed, timeBaseS(λ, "1"), memo).energyJ);
    class1PulseMj = Math.min(...values) * 1e3;
    class3BPulseMj = class3BPulseAelJ(λ, pulsed.pulseDurationS).energyJ * 1e3;
  }
  return {
    class1Mw,
    class2Mw,
    class3RMw: class2Mw !== null ? 5 * class2Mw : 5 * class1Mw,
    class3BMw: class3BAelMw(λ),
    class1PulseMj,
    class3BPulseMj,
  };
}

/** Average power (mW, null for a single pulse) and pulse energy (J, null for CW) as the input gives them. */
export function emissionOf(input: ClassInput): { averageMw: number | null; energyJ: number | null } {
  const τ = input.pulseDurationS;
  const f = input.pulseRepetitionRateHz;
  if (τ === undefined) return { averageMw: input.powerMw ?? 0, energyJ: null };
  if (input.pulseEnergyJ !== undefined) return { averageMw: f !== undefined ? input.pulseEnergyJ * f * 1e3 : null, energyJ: input.pulseEnergyJ };
  const P = input.powerMw ?? 0;
  // Without an energy: a train's power is its average; a single pulse's stated power is the power during the pulse.
  return f !== undefined ? { averageMw: P, energyJ: P / 1e3 / f } : { averageMw: null, energyJ: (P / 1e3) * τ };
}

/**
 * The class the accessible emission falls in: the lowest class whose limits the emission meets, in IEC order
 * 1, 1M, 2, 2M, 3R, 3B, 4. Class 1M/2M need Condition 3 (unaided eye) within the limit while Condition 1
 * (optical aids) exceeds it.
 */
export function classifyBeam(input: ClassInput): Classification {
  if (input.pulsesPerBurst !== undefined && input.burstPulseRateHz !== undefined && input.pulseDurationS !== undefined && input.pulseRepetitionRateHz !== undefined) {
    return classifyBursts(input as ClassInput & { pulsesPerBurst: number; burstPulseRateHz: number; pulseDurationS: number; pulseRepetitionRateHz: number });
  }
  return classifyEven(input);
}

/**
 * A train in bursts, classed as the higher of two even trains with the same average power (IEC 60825-1:2014 §4.3 f):
 * rules 1–3, and any group of pulses against the limit for the group's duration — from memory): (A) the same pulses
 * evenly spread at the average rate (every pulse counted, rule 1 per pulse), and (B) each burst as one pulse of its
 * total energy and length, repeated at the burst rate (the pulses inside a burst grouped). The cautious reading.
 */
function classifyBursts(input: ClassInput & { pulsesPerBurst: number; burstPulseRateHz: number; pulseDurationS: number; pulseRepetitionRateHz: number }): Classification {
  const { pulsesPerBurst: n, burstPulseRateHz: fb, pulseDurationS: τ, pulseRepetitionRateHz: f, ...rest } = input;
  const even: ClassInput = { ...rest, pulseDurationS: τ, pulseRepetitionRateHz: f };
  const a = classifyEven(even);
  const energyJ = a.pulseEnergyMj === null ? null : a.pulseEnergyMj / 1e3;
  const burstS = (n - 1) / fb + τ;
  const { powerMw: _p, pulseEnergyJ: _e, ...beam } = rest;
  const b = energyJ === null ? null : classifyEven({ ...beam, pulseEnergyJ: energyJ * n, pulseDurationS: burstS, pulseRepetitionRateHz: f / n });
  const worse = b !== null && classRank(b.hazardClass) > classRank(a.hazardClass) ? b : a;
  const reasons = [
    ...worse.reasons,
    `Pulses in bursts (${fmt(n)} at ${fmt(fb)} Hz inside a burst, ${fmt(f / n)} bursts per second): classed as the higher of the pulses spread evenly at ${fmt(f)} Hz (Class ${a.hazardClass}) and each burst as one ${fmt(burstS)} s pulse of ${fmt(n)} pulses' energy (Class ${b ? b.hazardClass : "not assessed"}).`,
  ];
  return { ...worse, pulseEnergyMj: a.pulseEnergyMj, averagePowerMw: a.averagePowerMw, reasons };
}

function classifyEven(input: ClassInput): Classification {
  const λ = input.wavelengthNm;
  const { averageMw, energyJ } = emissionOf(input);
  const pulse: PulseTiming | undefined =
    input.pulseDurationS !== undefined ? { pulseDurationS: input.pulseDurationS, pulseRepetitionRateHz: input.pulseRepetitionRateHz } : undefined;
  const memo: AelMemo = new Map();
  const limits = classLimits(λ, pulse, memo);
  const reasons: string[] = [];
  const sites = sitesAt(λ);

  const fractionAt = (apertureMm: number, distanceMm: number) =>
    fractionThrough(apertureMm, diameterAtMm(input.beamDiameterMm, input.divergenceMrad, distanceMm));

  // Ratios accessible emission ÷ AEL for one class multiple k of the Class 1 limits (k = 5 for 3R).
  // `what` is built only for the ratio that decides (formatting numbers is the costly part of a classification).
  type Ratio = { all: number; condition3: number; what: () => string };
  const worst = (a: Ratio, b: Ratio): Ratio => ({
    all: Math.max(a.all, b.all),
    condition3: Math.max(a.condition3, b.condition3),
    what: b.all > a.all ? b.what : a.what,
  });
  const none: Ratio = { all: 0, condition3: 0, what: () => "" };

  const accessibleEmission: AccessibleEmission[] = [];
  const class1Like = (forClass: "1" | "2" | "3R"): Ratio => {
    let out = none;
    const multiple = forClass === "3R" ? 5 : 1;
    const tb = timeBaseS(λ, forClass);
    for (const site of sites) {
      // Average rule (rule 2; CW power for a CW laser).
      if (averageMw !== null) {
        // Retina: Class 2 1 mW and visible 3R 5 mW; otherwise (a multiple of) the Class 1 limit, which at a band edge
        // and in 1200–1400 nm is the lower of the neighbouring rows (never more lenient than the retinal row alone).
        const limitMw =
          site === "retina"
            ? forClass !== "1" && isVisible(λ)
              ? multiple * 1
              : multiple * class1AelMw(λ)
            : multiple * (anteriorClass1Mw(λ) ?? Infinity);
        const g = geometry(λ, site, tb);
        const f3 = fractionAt(g.cond3.apertureMm, g.cond3.distanceMm);
        const f1 = g.cond1 ? fractionAt(g.cond1.apertureMm, g.cond1.distanceMm) : f3;
        if (forClass === "1" && site === sites[0]) {
          accessibleEmission.push({ condition: "3", ...g.cond3, powerMw: averageMw * f3, fraction: f3 });
          if (g.cond1) accessibleEmission.push({ condition: "1", ...g.cond1, powerMw: averageMw * f1, fraction: f1 });
        }
        out = worst(out, {
          all: (averageMw * Math.max(f1, f3)) / limitMw,
          condition3: (averageMw * f3) / limitMw,
          what: () => `average power against ${fmt(limitMw)} mW (${site === "retina" ? "retina" : "cornea/lens"})`,
        });
      }
      // Per-pulse rules 1 and 3.
      if (pulse && energyJ !== null) {
        const ael = class1PulseAelJ(λ, site, pulse, tb, memo);
        const limitJ = multiple * ael.energyJ;
        const g = geometry(λ, site, pulse.pulseDurationS);
        const f3 = fractionAt(g.cond3.apertureMm, g.cond3.distanceMm);
        const f1 = g.cond1 ? fractionAt(g.cond1.apertureMm, g.cond1.distanceMm) : f3;
        out = worst(out, {
          all: (energyJ * Math.max(f1, f3)) / limitJ,
          condition3: (energyJ * f3) / limitJ,
          what: () => `pulse energy against ${fmtJ(limitJ)} per pulse (${ael.rule === "single-pulse" ? "rule 1, single pulse" : "rule 3, C5 = N^−0.25"}, ${site === "retina" ? "retina" : "cornea/lens"})`,
        });
      }
    }
    return out;
  };

  const r1 = class1Like("1");
  // Class 2 (400–700 nm): 1 mW average; pulses meet the Class 1 per-pulse limits over the 0.25 s time base.
  // Outside 400–700 nm there is no Class 2: the Class 1 limits stand in (so a line there must meet Class 1 for the
  // laser to be Class 2; on its own it is then Class 1 already).
  const r2 = isVisible(λ) ? class1Like("2") : { ...r1, what: () => `${r1.what()}; no Class 2 outside 400–700 nm` };
  const r3R = class1Like("3R");
  // Class 3B: total emission, no aperture.
  let r3B: Ratio = none;
  if (averageMw !== null) r3B = worst(r3B, { all: averageMw / limits.class3BMw, condition3: averageMw / limits.class3BMw, what: () => `total power against the Class 3B limit ${fmt(limits.class3BMw)} mW` });
  if (pulse && energyJ !== null) {
    const p3B = class3BPulseAelJ(λ, pulse.pulseDurationS);
    r3B = worst(r3B, { all: energyJ / p3B.energyJ, condition3: energyJ / p3B.energyJ, what: () => `pulse energy against the Class 3B per-pulse limit ${fmtJ(p3B.energyJ)} (${p3B.row})` });
  }
  const ratios: ClassRatios = {
    "1": { all: r1.all, condition3: r1.condition3 },
    "2": { all: r2.all, condition3: r2.condition3 },
    "3R": { all: r3R.all, condition3: r3R.condition3 },
    "3B": { all: r3B.all, condition3: r3B.condition3 },
  };
  const hasCondition1 = hasCondition1At(λ);
  const decided = classFromRatios(ratios, hasCondition1);
  const deciding = { "1": r1, "1M": r1, "2": r2, "2M": r2, "3R": r3R, "3B": r3R, "4": r3B }[decided];
  reasons.push(reasonFor(decided, deciding, r3B));
  return {
    hazardClass: decided,
    limits,
    accessibleEmission,
    pulseEnergyMj: energyJ === null ? null : energyJ * 1e3,
    averagePowerMw: averageMw,
    ratios,
    governingLimit: deciding.what(),
    reasons,
    conditions: APPLIED_CONDITIONS,
    source: `${SOURCE.iecAel}; ${SOURCE.iecConditions} — ${UNCHECKED}`,
  };
}

/** Whether Condition 1 (optical aids) applies at this wavelength, i.e. whether Classes 1M and 2M exist there. */
export function hasCondition1At(λ: number): boolean {
  return sitesAt(λ).some((s) => geometry(λ, s, 100).cond1 !== null);
}

/** The lowest class whose ratios are within 1 (sum-of-fractions inputs allowed: ratios may be sums over lines). */
export function classFromRatios(ratios: ClassRatios, hasCondition1: boolean): HazardClass {
  if (ratios["3B"].all > 1) return "4";
  if (ratios["1"].all <= 1) return "1";
  if (hasCondition1 && ratios["1"].condition3 <= 1) return "1M";
  if (ratios["2"].all <= 1) return "2";
  if (hasCondition1 && ratios["2"].condition3 <= 1) return "2M";
  if (ratios["3R"].all <= 1) return "3R";
  return "3B";
}

function reasonFor(c: HazardClass, d: { all: number; condition3: number; what: () => string }, b: { all: number; what: () => string }): string {
  const deciding = { ...d, what: d.what() };
  const r3B = { ...b, what: c === "4" ? b.what() : "" };
  switch (c) {
    case "4":
      return `Above Class 3B: ${r3B.what} is exceeded ${fmt(r3B.all)}-fold.`;
    case "1":
    case "2":
      return `Within the Class ${c} limits under every condition (worst: ${deciding.what}, ${fmt(deciding.all * 100)} % of the limit).`;
    case "1M":
    case "2M":
      return `Within the Class ${c[0]} limits for the unaided eye (Condition 3, ${fmt(deciding.condition3 * 100)} % of the limit) but not with optical aids (Condition 1, ${fmt(deciding.all * 100)} %; ${deciding.what}).`;
    case "3R":
      return `Within the Class 3R limits (worst: ${deciding.what}, ${fmt(deciding.all * 100)} % of the limit).`;
    default:
      return `Above the Class 3R limits (${deciding.what}: ${fmt(deciding.all * 100)} % of the limit) and within the Class 3B limits.`;
  }
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
  return Number.isFinite(x) ? Number(x.toPrecision(4)).toString() : String(x);
}

function fmtJ(j: number): string {
  if (j >= 1) return `${fmt(j)} J`;
  if (j >= 1e-3) return `${fmt(j * 1e3)} mJ`;
  if (j >= 1e-6) return `${fmt(j * 1e6)} µJ`;
  return `${fmt(j * 1e9)} nJ`;
}
