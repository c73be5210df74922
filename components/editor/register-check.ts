// A laser taken from the laser register: the values it sets on the bench's laser, and the plain-words differences
// between what the drawing says and what the register lists. The same tolerances as the server's register check
// (lib/server/register.ts), which says the same on submission; this is the editor's early word, not the decision.
import { laserAveragePowerMw } from "@/lib/bench/laser-power";
import type { LaserElement } from "@/lib/bench/schema";

/** The register facts the editor uses (a subset of the server's LaserView). */
export type RegisterEntry = {
  id: string;
  model: string;
  serialNumber: string | null;
  labelClass: string;
  wavelengthsNm: number[];
  maxPowerMw: number;
  beamDiameterMm: number;
  divergenceMrad: number;
  pulseDurationS: number | null;
  pulseRepetitionRateHz: number | null;
  /** Energy of one pulse in mJ, where the register gives it. */
  pulseEnergyMj?: number | null;
  /** Trains in bursts: pulses per burst and the pulse rate inside a burst (the register keeps both or neither). */
  pulsesPerBurst?: number | null;
  burstPulseRateHz?: number | null;
  /** Further emission lines with their own power (residual pump, other harmonics). */
  lines?: { wavelengthNm: number; powerMw: number }[] | null;
  status: string;
};

export const WAVELENGTH_TOLERANCE_NM = 0.5;
export const DIAMETER_TOLERANCE = 0.1;
/** Register energy × rate and maximum power within this share of each other are the same reading (the bench document's 1 %). */
const AGREEMENT = 0.01;

const fmt = (x: number) => Number(x.toPrecision(4)).toString();

export const entryName = (e: Pick<RegisterEntry, "model" | "serialNumber">) => `${e.model}${e.serialNumber ? ` (serial ${e.serialNumber})` : ""}`;

/** The laser fields picking a register entry sets; undefined removes a field (a re-pick clears what the entry lacks). */
export type RegisterLaserValues = Pick<LaserElement, "registerId" | "wavelengthNm" | "beamDiameterMm" | "powerMw" | "pulseDurationS" | "pulseRepetitionRateHz" | "pulseEnergyJ" | "pulsesPerBurst" | "burstPulseRateHz" | "lines">;

/**
 * The laser's values from a register entry: the entry's id, the chosen wavelength (the first listed unless another
 * is named), its beam diameter and further lines, and its output as the bench document takes it:
 * - continuous-wave: the maximum power;
 * - a single pulse (duration, no rate): the pulse energy where the register gives one (no average power), else the old
 *   form, the maximum power during a pulse of that duration;
 * - a train (duration and rate): the maximum power as the average with the rate; the register's pulse energy as well when
 *   energy × rate agrees with it within 1 %. When they disagree (a register may rate them at different rates) the reading
 *   with the larger energy per pulse is kept — the cautious one: the energy with the rate when energy × rate is above the
 *   maximum power (the editor then says the power is above the register's), otherwise the maximum power alone;
 * - bursts: pulses per burst and the pulse rate inside a burst, with the train above (its rate is the average).
 */
export function laserValuesFrom(entry: RegisterEntry, wavelengthNm: number = entry.wavelengthsNm[0]): RegisterLaserValues {
  const values: RegisterLaserValues = {
    registerId: entry.id,
    wavelengthNm,
    powerMw: entry.maxPowerMw,
    beamDiameterMm: entry.beamDiameterMm,
    pulseDurationS: undefined,
    pulseRepetitionRateHz: undefined,
    pulseEnergyJ: undefined,
    pulsesPerBurst: undefined,
    burstPulseRateHz: undefined,
    lines: entry.lines?.length ? entry.lines.map((l) => ({ wavelengthNm: l.wavelengthNm, powerMw: l.powerMw })) : undefined,
  };
  const τ = entry.pulseDurationS;
  if (τ === null) return values;
  values.pulseDurationS = τ;
  const energyJ = entry.pulseEnergyMj != null ? entry.pulseEnergyMj / 1e3 : null;
  const f = entry.pulseRepetitionRateHz;
  if (f === null) {
    if (energyJ !== null) {
      values.powerMw = undefined;
      values.pulseEnergyJ = energyJ;
    }
    return values;
  }
  values.pulseRepetitionRateHz = f;
  if (energyJ !== null) {
    const fromEnergyMw = energyJ * f * 1e3;
    if (Math.abs(fromEnergyMw - entry.maxPowerMw) <= AGREEMENT * Math.max(fromEnergyMw, entry.maxPowerMw)) {
      values.pulseEnergyJ = energyJ;
    } else if (fromEnergyMw > entry.maxPowerMw) {
      values.powerMw = undefined;
      values.pulseEnergyJ = energyJ;
    }
  }
  if (entry.pulsesPerBurst != null && entry.burstPulseRateHz != null) {
    values.pulsesPerBurst = entry.pulsesPerBurst;
    values.burstPulseRateHz = entry.burstPulseRateHz;
  }
  return values;
}

export const listsWavelength = (entry: Pick<RegisterEntry, "wavelengthsNm">, wavelengthNm: number) =>
  entry.wavelengthsNm.some((w) => Math.abs(w - wavelengthNm) <= WAVELENGTH_TOLERANCE_NM);

export type RegisterMismatch = { code: "power-above-register" | "wavelength-not-registered" | "diameter-differs" | "laser-not-in-service"; message: string };

/** What the drawing's laser says that its register entry does not, in plain words. */
export function registerMismatches(laser: Pick<LaserElement, "powerMw" | "pulseEnergyJ" | "pulseDurationS" | "pulseRepetitionRateHz" | "wavelengthNm" | "beamDiameterMm">, entry: RegisterEntry): RegisterMismatch[] {
  const out: RegisterMismatch[] = [];
  const name = entryName(entry);
  if (entry.status !== "in-service") {
    out.push({ code: "laser-not-in-service", message: `The register says ${name} is not in service, so a bench using it cannot be sent for review. Ask the laser safety officer, or pick another laser.` });
  }
  const averageMw = laserAveragePowerMw(laser);
  if (averageMw !== null && averageMw > entry.maxPowerMw * (1 + 1e-9)) {
    out.push({
      code: "power-above-register",
      message: `${fmt(averageMw)} mW is more than this laser can give: the register's maximum for ${name} is ${fmt(entry.maxPowerMw)} mW. Check the power, or pick the laser you will really use.`,
    });
  }
  if (!listsWavelength(entry, laser.wavelengthNm)) {
    out.push({
      code: "wavelength-not-registered",
      message: `${fmt(laser.wavelengthNm)} nm is not a wavelength the register lists for ${name} (it lists ${entry.wavelengthsNm.map(fmt).join(", ")} nm).`,
    });
  }
  const ratio = laser.beamDiameterMm / entry.beamDiameterMm;
  if (Math.abs(ratio - 1) > DIAMETER_TOLERANCE) {
    out.push({
      code: "diameter-differs",
      message: `The beam diameter ${fmt(laser.beamDiameterMm)} mm is ${ratio < 1 ? "narrower (a more concentrated beam)" : "wider"} than the register's ${fmt(entry.beamDiameterMm)} mm for ${name}.`,
    });
  }
  return out;
}
