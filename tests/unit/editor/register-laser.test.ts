// A laser from the laser register: the values picking an entry sets (and undoes in one step), and the plain-words
// differences between the drawing and the register with the server's tolerances (lib/server/register.ts: 0.5 nm,
// 10 % of the beam diameter, power not above the listed maximum). No published formula is involved.
import { describe, expect, it } from "vitest";
import type { BenchDocument, LaserElement } from "@/lib/bench/schema";
import { benchDocumentSchema } from "@/lib/bench/schema";
import { editorReducer, initialEditorState } from "@/components/editor/editor-reducer";
import { analyzeBench } from "@/lib/optics";
import { assessBench } from "@/lib/safety";
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

describe("a pulsed register entry on the bench", () => {
  // An invented burst-mode fibre laser: 10 µJ pulses of 10 ns, 10 pulses per burst at 1 MHz inside the burst, 1 000 bursts
  // per second, so 10 000 pulses per second on average and 100 mW average power (10 µJ × 10 kHz).
  const burstLaser: RegisterEntry = {
    ...heNe,
    id: "5a3f2b9e-0000-4000-8000-000000000003",
    model: "Northmere Photonics BF-2",
    labelClass: "4",
    wavelengthsNm: [1064],
    maxPowerMw: 100,
    beamDiameterMm: 2,
    pulseEnergyMj: 0.01,
    pulseDurationS: 1e-8,
    pulseRepetitionRateHz: 1e4,
    pulsesPerBurst: 10,
    burstPulseRateHz: 1e6,
  };
  const onBench = (entry: RegisterEntry) => editorReducer(initialEditorState({ version: 1, elements: [] }), { type: "add", kind: "laser", positionMm: 0, values: laserValuesFrom(entry) }).doc;

  it("a laser in bursts keeps its bursts, its average rate and its energy (energy × rate agrees with the maximum power)", () => {
    const doc = onBench(burstLaser);
    expect(doc.elements[0]).toEqual({ id: "laser-1", kind: "laser", positionMm: 0, registerId: burstLaser.id, wavelengthNm: 1064, powerMw: 100, beamDiameterMm: 2, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, pulseEnergyJ: 1e-5, pulsesPerBurst: 10, burstPulseRateHz: 1e6 });
    // The bench document's own rules accept what the register accepted.
    expect(benchDocumentSchema.safeParse(doc).success).toBe(true);
    // And the hazard engine weighs it as bursts (the burst rule among its rules).
    const a = assessBench(doc as BenchDocument, analyzeBench(doc as BenchDocument));
    expect(a.laser.pulsedMpe?.rules.map((r) => r.rule)).toContain("burst");
    expect(a.laser.notes.join(" ")).toMatch(/Pulses in bursts/);
  });

  it("re-picking a continuous laser clears the energy and the burst fields too", () => {
    const doc: BenchDocument = { version: 1, elements: [laserAt({ ...laserValuesFrom(burstLaser) })] };
    const laser = editorReducer(initialEditorState(doc), { type: "update", id: "laser-1", patch: laserValuesFrom(heNe) }).doc.elements[0] as Record<string, unknown>;
    for (const key of ["pulseEnergyJ", "pulseDurationS", "pulseRepetitionRateHz", "pulsesPerBurst", "burstPulseRateHz"]) expect(key in laser, key).toBe(false);
    expect(laser.powerMw).toBe(0.95);
  });

  it("a single pulse with an energy is entered by its energy, with no average power", () => {
    const single: RegisterEntry = { ...burstLaser, pulseEnergyMj: 200, pulseRepetitionRateHz: null, pulsesPerBurst: null, burstPulseRateHz: null };
    const laser = onBench(single).elements[0] as Record<string, unknown>;
    expect(laser).toMatchObject({ pulseEnergyJ: 0.2, pulseDurationS: 1e-8 });
    expect("powerMw" in laser).toBe(false);
    expect(benchDocumentSchema.safeParse(onBench(single)).success).toBe(true);
  });

  it("energy × rate and maximum power that disagree: the reading with the larger energy per pulse is kept", () => {
    // 50 µJ × 10 kHz = 500 mW, above the listed 100 mW: the energy and rate are kept (the editor then warns of the power).
    const moreEnergy = onBench({ ...burstLaser, pulseEnergyMj: 0.05 }).elements[0] as Record<string, unknown>;
    expect(moreEnergy).toMatchObject({ pulseEnergyJ: 5e-5, pulseRepetitionRateHz: 1e4 });
    expect("powerMw" in moreEnergy).toBe(false);
    // 1 µJ × 10 kHz = 10 mW, below 100 mW: the maximum power alone (10 µJ per pulse from 100 mW ÷ 10 kHz).
    const lessEnergy = onBench({ ...burstLaser, pulseEnergyMj: 0.001 }).elements[0] as Record<string, unknown>;
    expect(lessEnergy).toMatchObject({ powerMw: 100, pulseRepetitionRateHz: 1e4 });
    expect("pulseEnergyJ" in lessEnergy).toBe(false);
    for (const e of [0.05, 0.001]) expect(benchDocumentSchema.safeParse(onBench({ ...burstLaser, pulseEnergyMj: e })).success).toBe(true);
  });

  it("further lines listed in the register come along", () => {
    const laser = onBench({ ...burstLaser, lines: [{ wavelengthNm: 808, powerMw: 5 }] }).elements[0] as Record<string, unknown>;
    expect(laser.lines).toEqual([{ wavelengthNm: 808, powerMw: 5 }]);
  });
});
