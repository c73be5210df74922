// Power figures of a laser element: average power (CW or train), the power that drives the beam drawing, pulse energy.
// A pulsed laser is given by pulseEnergyJ (+ rate) or by average powerMw + rate (the bench document contract, contract revision 2).

type LaserPowerFields = {
  powerMw?: number;
  pulseEnergyJ?: number;
  pulseDurationS?: number;
  pulseRepetitionRateHz?: number;
  pulsesPerBurst?: number;
  burstPulseRateHz?: number;
};

/** Average power in mW: CW power, a train's average (energy × rate); null for a single pulse. */
export function laserAveragePowerMw(laser: LaserPowerFields): number | null {
  if (laser.powerMw !== undefined) {
    // The old form of a single pulse (power + duration, no rate) states the power during the pulse, not an average.
    if (laser.pulseDurationS !== undefined && laser.pulseRepetitionRateHz === undefined) return null;
    return laser.powerMw;
  }
  if (laser.pulseEnergyJ !== undefined && laser.pulseRepetitionRateHz !== undefined) return laser.pulseEnergyJ * laser.pulseRepetitionRateHz * 1000;
  return null;
}

/** Energy of one pulse in J; null for a CW laser. */
export function laserPulseEnergyJ(laser: LaserPowerFields): number | null {
  if (laser.pulseDurationS === undefined) return null;
  if (laser.pulseEnergyJ !== undefined) return laser.pulseEnergyJ;
  if (laser.powerMw === undefined) return null;
  return laser.pulseRepetitionRateHz !== undefined
    ? laser.powerMw / 1000 / laser.pulseRepetitionRateHz
    : (laser.powerMw / 1000) * laser.pulseDurationS; // old single-pulse form: power during the pulse
}

/**
 * The power that scales the beam through the bench in mW: the average power, or for a single pulse the power during
 * the pulse (energy ÷ duration). Ratios of it along the bench are what the hazard figures use.
 */
export function laserBeamPowerMw(laser: LaserPowerFields): number {
  const average = laserAveragePowerMw(laser);
  if (average !== null) return average;
  if (laser.powerMw !== undefined) return laser.powerMw;
  if (laser.pulseEnergyJ !== undefined && laser.pulseDurationS !== undefined) return (laser.pulseEnergyJ / laser.pulseDurationS) * 1000;
  return 0;
}

/** Plain text for a laser's output: "200 mW", "5 mJ × 10 Hz (50 mW)", "2 J single pulse, 10 ns". */
export function laserPowerText(laser: LaserPowerFields): string {
  const fmt = (x: number) => Number(x.toPrecision(4)).toString();
  const average = laserAveragePowerMw(laser);
  const energy = laserPulseEnergyJ(laser);
  if (energy === null) return `${fmt(laser.powerMw ?? 0)} mW`;
  const energyText = energy >= 1e-3 ? `${fmt(energy * 1e3)} mJ` : `${fmt(energy * 1e6)} µJ`;
  const duration = laser.pulseDurationS !== undefined ? `, ${fmt(laser.pulseDurationS)} s pulses` : "";
  if (average === null) return `${energyText} single pulse${duration}`;
  const bursts =
    laser.pulsesPerBurst !== undefined && laser.burstPulseRateHz !== undefined
      ? `, in bursts of ${fmt(laser.pulsesPerBurst)} at ${fmt(laser.burstPulseRateHz)} Hz (${fmt((laser.pulseRepetitionRateHz ?? 0) / laser.pulsesPerBurst)} bursts per second)`
      : "";
  return `${energyText} × ${fmt(laser.pulseRepetitionRateHz ?? 0)} Hz (${fmt(average)} mW average)${duration}${bursts}`;
}
