// A laser from the laser register: the values picking an entry sets (and undoes in one step), and the plain-words
// differences between the drawing and the register with the server's tolerances (lib/server/register.ts: 0.5 nm,
// 10 % of the beam diameter, power not above the listed maximum). No published formula is involved.
import { describe, expect, it } from "vitest";
import type { BenchDocument, LaserElement } from "@/lib/bench/schema";
import { benchDocumentSchema } from "@/lib/bench/schema";
import { editorReducer, initialEditorState } from "@/components/editor/editor-reducer";
import { laserValuesFrom, listsWavelength, registerMismatches, type RegisterEntry } from "@/components/editor/register-check";

const heNe: RegisterEntry = {
  id: "5a3f2b9e-0000-4000-8000-000000000001",
  model: "Northmere Optics HN-10",
  serialNumber: "HN-1",
  labelClass: "2",
  wavelengthsNm: [632.8],
  maxPowerMw: 0.95,
  beamDiameterMm: 0.8,
  divergenceMrad: 1,
  pulseDurationS: null,
  pulseRepetitionRateHz: null,
  status: "in-service",
};
const yag: RegisterEntry = { ...heNe, id: "5a3f2b9e-0000-4000-8000-000000000002", model: "Nd:YAG", wavelengthsNm: [532, 1064], maxPowerMw: 2000, beamDiameterMm: 6, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10 };

const laserAt = (values: Partial<LaserElement>): LaserElement => ({ id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 0.95, beamDiameterMm: 0.8, ...values });

describe("picking a register entry", () => {
  it("sets the register id, the first wavelength, the maximum power and the beam diameter on a new laser", () => {
    const state = editorReducer(initialEditorState({ version: 1, elements: [] }), { type: "add", kind: "laser", positionMm: 0, values: laserValuesFrom(yag) });
    const laser = state.doc.elements[0] as LaserElement;
    expect(laser).toMatchObject({ id: "laser-1", kind: "laser", registerId: yag.id, wavelengthNm: 532, powerMw: 2000, beamDiameterMm: 6, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10 });
    expect(state.selection).toEqual(["laser-1"]);
    expect(benchDocumentSchema.safeParse(state.doc).success).toBe(true);
  });

  it("re-picking a continuous laser clears the pulse data, and one undo brings the old values back", () => {
    const doc: BenchDocument = { version: 1, elements: [laserAt({ ...laserValuesFrom(yag) })] };
    const picked = editorReducer(initialEditorState(doc), { type: "update", id: "laser-1", patch: laserValuesFrom(heNe) });
    const laser = picked.doc.elements[0] as Record<string, unknown>;
    expect(laser).toMatchObject({ registerId: heNe.id, wavelengthNm: 632.8, powerMw: 0.95, beamDiameterMm: 0.8 });
    expect("pulseDurationS" in laser).toBe(false);
    expect("pulseRepetitionRateHz" in laser).toBe(false);
    expect(editorReducer(picked, { type: "undo" }).doc).toEqual(doc);
  });

  it("making it ad hoc removes only the register id", () => {
    const doc: BenchDocument = { version: 1, elements: [laserAt({ registerId: heNe.id })] };
    const adHoc = editorReducer(initialEditorState(doc), { type: "update", id: "laser-1", patch: { registerId: undefined } });
    expect(adHoc.doc.elements[0]).toEqual(laserAt({}));
  });
});

describe("what the drawing asks that the register does not list", () => {
  it("nothing for the register's own values", () => {
    expect(registerMismatches(laserAt({}), heNe)).toEqual([]);
  });

  it("power above the listed maximum, in plain words", () => {
    const [m] = registerMismatches(laserAt({ powerMw: 2 }), heNe);
    expect(m.code).toBe("power-above-register");
    expect(m.message).toBe("2 mW is more than this laser can give: the register's maximum for Northmere Optics HN-10 (serial HN-1) is 0.95 mW. Check the power, or pick the laser you will really use.");
  });

  it("a wavelength the register does not list (0.5 nm tolerance, as on the server)", () => {
    expect(listsWavelength(yag, 1064.4)).toBe(true);
    expect(listsWavelength(yag, 1065)).toBe(false);
    const codes = registerMismatches(laserAt({ wavelengthNm: 633.5 }), heNe).map((m) => m.code);
    expect(codes).toEqual(["wavelength-not-registered"]);
    expect(registerMismatches(laserAt({ wavelengthNm: 633.5 }), heNe)[0].message).toMatch(/633\.5 nm is not a wavelength the register lists .* \(it lists 632\.8 nm\)/);
  });

  it("a beam diameter more than 10 % off, and a laser out of service", () => {
    expect(registerMismatches(laserAt({ beamDiameterMm: 0.87 }), heNe)).toEqual([]);
    expect(registerMismatches(laserAt({ beamDiameterMm: 0.5 }), heNe).map((m) => m.code)).toEqual(["diameter-differs"]);
    expect(registerMismatches(laserAt({}), { ...heNe, status: "out-of-service" }).map((m) => m.code)).toEqual(["laser-not-in-service"]);
  });
});
