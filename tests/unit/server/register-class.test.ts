// The laser register's class estimate uses the pulse energy an entry gives (the bench document contract revision 2:
// pulseEnergyJ), beside its maximum power, and keeps the higher class of the two readings: the cautious answer.
// Limits: IEC 60825-1:2014 Tables 3–8 as lib/safety/classify.ts gives them (values from memory, not checked against the text).
import { describe, expect, it } from "vitest";
import { computeClass } from "../../../lib/server/register";
import { classifyBeam } from "../../../lib/safety";

const base = { labelClass: "3B" as const, wavelengthsNm: [1064], beamDiameterMm: 3, divergenceMrad: 0.5, pulseRepetitionRateHz: null, lines: null };

describe("register class estimate with a pulse energy", () => {
  it("a single 10 mJ, 10 ns pulse at 1064 nm is classed from its energy, not from a small rated power", () => {
    const withEnergy = computeClass({ ...base, maxPowerMw: 1, pulseDurationS: 1e-8, pulseEnergyMj: 10 });
    const without = computeClass({ ...base, maxPowerMw: 1, pulseDurationS: 1e-8, pulseEnergyMj: null });
    // Independent reading: the engine on the energy alone (IEC 60825-1:2014 per-pulse AEL, rule 1).
    const alone = classifyBeam({ wavelengthNm: 1064, pulseEnergyJ: 0.01, pulseDurationS: 1e-8, beamDiameterMm: 3, divergenceMrad: 0.5 }).hazardClass;
    expect(["3B", "4"]).toContain(alone);
    expect(withEnergy.hazardClass).toBe(alone);
    expect(without.hazardClass).toBe("1");
    expect(withEnergy.reasons.join(" ")).toMatch(/from the pulse energy 10 mJ: Class (3B|4)/);
  });

  it("a train keeps the higher of the power reading and the energy reading", () => {
    const facts = { ...base, maxPowerMw: 5, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10 };
    const low = computeClass({ ...facts, pulseEnergyMj: 0.5 });
    const high = computeClass({ ...facts, pulseEnergyMj: 100 });
    const rank = (c: string | null) => ["1", "1M", "2", "2M", "3R", "3B", "4"].indexOf(c ?? "");
    expect(rank(high.hazardClass)).toBeGreaterThanOrEqual(rank(low.hazardClass));
    expect(rank(low.hazardClass)).toBeGreaterThanOrEqual(rank(computeClass({ ...facts, pulseEnergyMj: null }).hazardClass));
    expect(high.hazardClass).toBe(classifyBeam({ wavelengthNm: 1064, pulseEnergyJ: 0.1, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10, beamDiameterMm: 3, divergenceMrad: 0.5 }).hazardClass);
  });

  it("an energy without a duration is not used, and the reasons say so", () => {
    const c = computeClass({ ...base, maxPowerMw: 1, pulseDurationS: null, pulseEnergyMj: 10 });
    expect(c.reasons.join(" ")).toMatch(/pulse energy is not used: the entry gives no pulse duration/);
  });
});
