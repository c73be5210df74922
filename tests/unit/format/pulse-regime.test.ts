// The pulse regime of each line in words (lib/format/pulse-regime.ts), as the review screen and the build sheet show it,
// and the governing rule taken from the hazard engine (lib/safety/pulsed.ts governingRule). Words and arithmetic only
// (energy per pulse = average power ÷ rate; bursts per second = average rate ÷ pulses per burst); no published value.
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { plainText } from "@/lib/format";
import { durationWords, energyWords, PULSE_RULE_WORDS, pulseRegimeWords, rateWords, regimeRows } from "@/lib/format/pulse-regime";
import { analyzeBench } from "@/lib/optics";
import { assessBench } from "@/lib/safety";
import { UNCHECKED } from "@/lib/safety/types";
import { tableRegime } from "@/components/review/pulse-regime";

const main = { main: true, powerMw: 0 };

describe("units people read", () => {
  it("energies, durations and rates in the unit that keeps the figure readable", () => {
    expect([energyWords(2), energyWords(0.2), energyWords(1e-5), energyWords(5e-9)]).toEqual(["2 J", "200 mJ", "10 µJ", "5 nJ"]);
    expect([durationWords(1), durationWords(0.01), durationWords(8e-9), durationWords(1e-13)]).toEqual(["1 s", "10 ms", "8 ns", "100 fs"]);
    expect([rateWords(10), rateWords(1e4), rateWords(8e7), rateWords(0.5)]).toEqual(["10 Hz", "10 kHz", "80 MHz", "0.5 Hz"]);
  });
});

describe("the regime of a line", () => {
  it("continuous-wave: the power, and no pulse rule", () => {
    expect(pulseRegimeWords({ powerMw: 5 }, { main: true, powerMw: 5 }, null)).toEqual({ kind: "continuous", title: "Continuous-wave", figures: "5 mW", rule: null });
  });

  it("a single pulse: its energy and duration, and the rule that governs", () => {
    const w = pulseRegimeWords({ pulseEnergyJ: 0.2, pulseDurationS: 1e-8 }, main, "single-pulse");
    expect(w).toEqual({ kind: "single-pulse", title: "Single pulse", figures: "200 mJ in 10 ns", rule: `MPE governed by ${PULSE_RULE_WORDS["single-pulse"]}` });
    // The old form (power during the pulse × duration): 1 000 W × 10 ns = 10 µJ.
    expect(pulseRegimeWords({ powerMw: 1e6, pulseDurationS: 1e-8 }, { main: true, powerMw: 1e6 }, "single-pulse").figures).toBe("10 µJ in 10 ns");
  });

  it("a train: energy per pulse, rate, duration and the average power, whichever way it was entered", () => {
    const byEnergy = pulseRegimeWords({ pulseEnergyJ: 5e-3, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10 }, main, "pulse-train");
    const byPower = pulseRegimeWords({ powerMw: 50, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10 }, main, "pulse-train");
    expect(byEnergy.figures).toBe("5 mJ per pulse at 10 Hz, 8 ns pulses (50 mW average)");
    expect(byPower).toEqual(byEnergy);
    expect(byEnergy).toMatchObject({ kind: "train", title: "Pulse train", rule: "MPE governed by rule 3, each pulse of the train with C_P = N^−0.25" });
  });

  it("bursts: pulses per burst, bursts per second, the rate inside a burst and the energy per pulse", () => {
    const laser = { pulseEnergyJ: 1e-5, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, pulsesPerBurst: 10, burstPulseRateHz: 1e6 };
    expect(pulseRegimeWords(laser, main, "burst")).toEqual({
      kind: "burst",
      title: "Pulses in bursts",
      figures: "10 pulses per burst, 1,000 bursts per second, 1 MHz inside a burst; 10 µJ per pulse, 10 ns pulses (10 kHz, 100 mW on average)",
      rule: "MPE governed by the burst rule, each burst taken as one pulse of its energy and length",
    });
  });

  it("a further line shares the timing, with its own energy: 20 mW average at 10 Hz is 2 mJ per pulse", () => {
    const laser = { pulseEnergyJ: 5e-3, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10 };
    expect(pulseRegimeWords(laser, { main: false, powerMw: 20 }, "pulse-train").figures).toBe("2 mJ per pulse at 10 Hz, 8 ns pulses (20 mW average)");
    // for a single pulse a further line's power is the power during the pulse: 1 kW × 8 ns = 8 µJ
    expect(pulseRegimeWords({ pulseEnergyJ: 5e-3, pulseDurationS: 8e-9 }, { main: false, powerMw: 1e6 }, "single-pulse").figures).toBe("8 µJ in 8 ns");
  });

  it("overlapping pulses are read as continuous-wave, as the engine reads them", () => {
    expect(pulseRegimeWords({ powerMw: 5, pulseDurationS: 1e-3, pulseRepetitionRateHz: 2000 }, { main: true, powerMw: 5 }, null).kind).toBe("continuous");
  });
});

describe("the rule the engine names, per line", () => {
  it("a rail laser in bursts with a residual line: every line says its regime and the engine's governing rule", () => {
    const doc: BenchDocument = {
      version: 1,
      elements: [
        { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, pulseEnergyJ: 1e-5, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, pulsesPerBurst: 10, burstPulseRateHz: 1e6, beamDiameterMm: 2, lines: [{ wavelengthNm: 1064, powerMw: 20 }] },
        { id: "block-1", kind: "beam-block", positionMm: 300 },
      ],
    };
    const safety = assessBench(doc, analyzeBench(doc));
    const rows = regimeRows("laser-1", doc.elements[0] as Parameters<typeof regimeRows>[1], safety.lines.lines.map((l) => ({ ...l, rule: l.assessment.pulsedMpe?.governingRule ?? null })));
    expect(rows.map((r) => [r.wavelengthNm, r.words.kind])).toEqual([
      [532, "burst"],
      [1064, "burst"],
    ]);
    for (const [i, line] of safety.lines.lines.entries()) {
      const rule = line.assessment.pulsedMpe!.governingRule;
      expect(rows[i].words.rule).toBe(`MPE governed by ${PULSE_RULE_WORDS[rule]}`);
    }
    expect(rows[1].words.figures).toMatch(/^10 pulses per burst, 1,000 bursts per second, 1 MHz inside a burst; 2 µJ per pulse/);
    // The source printed beside them names the clause and says it is not yet checked; never "from memory".
    const source = plainText(safety.laser.pulsedMpe!.source);
    expect(source).toMatch(/ANSI Z136\.1-2014 §8\.2\.3/);
    expect(source).toContain(UNCHECKED);
    expect(source).not.toMatch(/from memory|\.ts\b/);
  });

  it("a table: each laser's lines with the rule from the table's own line figures", () => {
    const doc: BenchDocumentV2 = {
      version: 2,
      table: { widthMm: 1000, depthMm: 600, holePitchMm: 25 },
      elements: [
        { id: "Y", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 532, pulseEnergyJ: 5e-3, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10, beamDiameterMm: 6, lines: [{ wavelengthNm: 1064, powerMw: 20 }] },
        { id: "G", kind: "laser", xMm: 100, yMm: 400, angleDeg: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 1 },
        { id: "B1", kind: "beam-block", xMm: 800, yMm: 100, angleDeg: 180 },
        { id: "B2", kind: "beam-block", xMm: 800, yMm: 400, angleDeg: 180 },
      ],
    };
    const safety = assessBench(doc, analyzeBench(doc));
    const { rows, source } = tableRegime(doc, safety);
    expect(rows.map((r) => [r.laserId, r.wavelengthNm, r.words.kind])).toEqual([
      ["G", 632.8, "continuous"],
      ["Y", 532, "train"],
      ["Y", 1064, "train"],
    ]);
    const yLines = safety.lasers.find((l) => l.laserId === "Y")!.lines;
    expect(yLines.every((l) => l.pulseRule !== null)).toBe(true);
    expect(rows[1].words.rule).toBe(`MPE governed by ${PULSE_RULE_WORDS[yLines[0].pulseRule!]}`);
    expect(rows[2].words.figures).toBe("2 mJ per pulse at 10 Hz, 8 ns pulses (20 mW average)");
    expect(rows[0].words.rule).toBeNull();
    expect(plainText(source!)).toContain(UNCHECKED);
  });
});
