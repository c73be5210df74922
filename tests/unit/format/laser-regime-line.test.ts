// The editor's regime line under a laser's fields: what was typed, in the review screen's words.
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { LaserRegimeLine } from "@/components/review/pulse-regime";

const text = (laser: Parameters<typeof LaserRegimeLine>[0]["laser"]) => renderToStaticMarkup(createElement(LaserRegimeLine, { laser })).replace(/<[^>]+>/g, "").replaceAll("<!-- -->", "");

describe("the editor's pulse regime line", () => {
  it("says continuous-wave with the power for a laser without pulses", () => {
    expect(text({ powerMw: 5 })).toBe("Pulse regime: Continuous-wave — 5 mW");
  });
  it("gives a single pulse's energy and duration", () => {
    expect(text({ pulseEnergyJ: 0.01, pulseDurationS: 8e-9 })).toBe("Pulse regime: Single pulse — 10 mJ in 8 ns");
  });
  it("names a train and bursts as such", () => {
    expect(text({ pulseEnergyJ: 1e-5, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4 })).toMatch(/^Pulse regime: Pulse train — /);
    expect(text({ pulseEnergyJ: 1e-5, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, pulsesPerBurst: 10, burstPulseRateHz: 1e6 })).toMatch(/^Pulse regime: Pulses in bursts — /);
  });
});
