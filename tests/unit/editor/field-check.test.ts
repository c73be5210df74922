// The editor's laser power field: it may be left empty for a single pulse given by its energy (the bench document
// contract, revision 2: powerMw optional only for a single pulse), never for a continuous laser or a train without energy.
import { describe, expect, it } from "vitest";
import { checkField } from "../../../components/editor/field-check";
import { parseNumber } from "../../../components/editor/number-parse";
import { ELEMENT_KIND_RECORDS } from "../../../lib/bench/element-kinds";
import type { BenchElement } from "../../../lib/bench/schema";

const cw: BenchElement = { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 5, beamDiameterMm: 1 };

describe("the laser's power field", () => {
  it("is marked as a field that may be empty, with its label unchanged", () => {
    const field = ELEMENT_KIND_RECORDS.laser.fields.find((f) => f.key === "powerMw")!;
    expect(field.label).toBe("Power");
    expect(field.optional).toBeFalsy();
    expect(field.allowEmpty).toBe(true);
    expect(field.hint).toMatch(/single pulse/);
    expect(parseNumber("", true)).toEqual({ value: undefined });
  });

  it("refuses empty for a continuous laser, naming the rule", () => {
    expect(checkField(cw, "powerMw")(undefined)).toMatch(/Power \(powerMw\) is required unless a single pulse is given by its energy/);
    expect(checkField(cw, "powerMw")(10)).toBeNull();
  });

  it("accepts empty for a single pulse given by its energy and duration", () => {
    const single = { ...cw, pulseEnergyJ: 0.01, pulseDurationS: 8e-9 } as BenchElement;
    expect(checkField(single, "powerMw")(undefined)).toBeNull();
    // a single pulse with an average power as well is refused by the document schema, not by this field
    const train = { ...cw, pulseDurationS: 8e-9, pulseRepetitionRateHz: 20 } as BenchElement;
    expect(checkField(train, "powerMw")(undefined)).toMatch(/required unless a single pulse/);
  });

  it("other fields keep their plain schema check", () => {
    expect(checkField(cw, "beamDiameterMm")(-1)).toMatch(/Beam diameter/);
    expect(checkField(cw, "wavelengthNm")(532)).toBeNull();
  });
});
