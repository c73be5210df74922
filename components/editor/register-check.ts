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
  status: string;
};

export const WAVELENGTH_TOLERANCE_NM = 0.5;
export const DIAMETER_TOLERANCE = 0.1;

const fmt = (x: number) => Number(x.toPrecision(4)).toString();

export const entryName = (e: Pick<RegisterEntry, "model" | "serialNumber">) => `${e.model}${e.serialNumber ? ` (serial ${e.serialNumber})` : ""}`;

/**
 * The laser's values from a register entry: the entry's id, the chosen wavelength (the first listed unless another
 * is named), its maximum power and beam diameter; pulse data when the register lists the laser as pulsed.
 */
export function laserValuesFrom(entry: RegisterEntry, wavelengthNm: number = entry.wavelengthsNm[0]) {
  return {
    registerId: entry.id,
    wavelengthNm,
    powerMw: entry.maxPowerMw,
    beamDiameterMm: entry.beamDiameterMm,
    pulseDurationS: entry.pulseDurationS ?? undefined,
    pulseRepetitionRateHz: entry.pulseDurationS !== null ? (entry.pulseRepetitionRateHz ?? undefined) : undefined,
  };
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
