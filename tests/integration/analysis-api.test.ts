// The analysis endpoints over HTTP: every bad input of the contract gets a 400 that names the field
// and the problem (never a 500), and good input gets the optics and safety answers.
import { beforeAll, describe, expect, it } from "vitest";
import { call, DEMO, signIn } from "../support/http";

let cookie = "";
beforeAll(async () => {
  cookie = (await signIn(DEMO.researcher)).cookie;
});

const laser = { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 };
const bench = {
  version: 1,
  elements: [laser, { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: -25 }, { id: "iris", kind: "aperture", positionMm: 400, diameterMm: 2 }, { id: "screen", kind: "screen", positionMm: 1400 }],
};

type Problem = { path: string; message: string };
const fieldsOf = (json: Record<string, unknown> | null) => ((json?.error as { fields: Problem[] }) ?? { fields: [] }).fields;

describe("POST /api/analyze", () => {
  it("answers a HeNe bench with the beam, the aperture's zones and the safety figures", async () => {
    const res = await call("POST", "/api/analyze", cookie, bench);
    expect(res.status).toBe(200);
    const { analysis, safety } = res.json as { analysis: { elements: { id: string }[]; apertures: { id: string; fresnelNumber: number; centre: string }[] }; safety: { governing: unknown } };
    expect(analysis.elements.map((e) => e.id)).toEqual(["laser", "lens", "iris", "screen"]);
    expect(analysis.apertures[0].id).toBe("iris");
    expect(analysis.apertures[0].fresnelNumber).toBeGreaterThan(0);
    expect(["bright", "dark", "between"]).toContain(analysis.apertures[0].centre);
    expect(safety.governing).toBeTruthy();
  });

  it("refuses anonymous callers", async () => {
    expect((await call("POST", "/api/analyze", undefined, bench)).status).toBe(401);
  });

  const cases: [string, unknown, string, RegExp][] = [
    ["no laser", { version: 1, elements: [{ id: "s", kind: "screen", positionMm: 5 }] }, "elements", /exactly one laser; it has none/],
    ["two lasers", { version: 1, elements: [laser, { ...laser, id: "laser-2" }] }, "elements", /it has 2/],
    ["an unknown kind", { version: 1, elements: [laser, { id: "m", kind: "mirror", positionMm: 5 }] }, "elements.1.kind", /must be one of/],
    ["a zero diameter", { version: 1, elements: [laser, { id: "a", kind: "aperture", positionMm: 5, diameterMm: 0 }] }, "elements.1.diameterMm", /greater than 0/],
    ["a negative diameter", { version: 1, elements: [{ ...laser, beamDiameterMm: -1 }] }, "elements.0.beamDiameterMm", /greater than 0/],
    ["a wavelength below 180 nm", { version: 1, elements: [{ ...laser, wavelengthNm: 100 }] }, "elements.0.wavelengthNm", /180 nm and 1 mm/],
    ["a wavelength above 1 mm", { version: 1, elements: [{ ...laser, wavelengthNm: 2_000_000 }] }, "elements.0.wavelengthNm", /180 nm and 1 mm/],
    ["a string where a number belongs", { version: 1, elements: [{ ...laser, powerMw: "1" }] }, "elements.0.powerMw", /must be a number/],
    ["more than 200 elements", { version: 1, elements: [laser, ...Array.from({ length: 200 }, (_, i) => ({ id: `s${i}`, kind: "screen", positionMm: i + 1 }))] }, "elements", /at most 200/],
  ];
  for (const [name, body, path, message] of cases) {
    it(`400 for ${name}`, async () => {
      const res = await call("POST", "/api/analyze", cookie, body);
      expect(res.status).toBe(400);
      const problem = fieldsOf(res.json).find((f) => f.path === path);
      expect(problem?.message).toMatch(message);
    });
  }

  it("400 for NaN and Infinity, which JSON cannot carry (sent as bare tokens)", async () => {
    for (const token of ["NaN", "Infinity", "-Infinity"]) {
      const res = await call("POST", "/api/analyze", cookie, `{"version":1,"elements":[{"id":"l","kind":"laser","positionMm":${token},"wavelengthNm":633,"powerMw":1,"beamDiameterMm":1}]}`);
      expect(res.status).toBe(400);
      expect((res.json!.error as { message: string }).message).toMatch(/not valid JSON/);
    }
  });

  it("400 for a huge number that overflows to Infinity", async () => {
    const res = await call("POST", "/api/analyze", cookie, `{"version":1,"elements":[{"id":"l","kind":"laser","positionMm":1e999,"wavelengthNm":633,"powerMw":1,"beamDiameterMm":1}]}`);
    expect(res.status).toBe(400);
    expect(fieldsOf(res.json)[0].path).toBe("elements.0.positionMm");
  });

  it("400 for malformed JSON, an empty body and a body over 256 kB", async () => {
    expect((await call("POST", "/api/analyze", cookie, "{")).status).toBe(400);
    expect((await call("POST", "/api/analyze", cookie, "")).status).toBe(400);
    const huge = await call("POST", "/api/analyze", cookie, { ...bench, title: "x".repeat(270_000) });
    expect(huge.status).toBe(400);
    expect((huge.json!.error as { message: string }).message).toMatch(/larger than 256 kB/);
  });
});

describe("POST /api/analyze/profile and /api/analyze/finder", () => {
  it("gives a profile whose centre equals the centre ratio", async () => {
    const analysis = (await call("POST", "/api/analyze", cookie, bench)).json!.analysis as { apertures: { centreIntensityRatio: number }[] };
    const res = await call("POST", "/api/analyze/profile", cookie, { document: bench, apertureId: "iris", points: 64 });
    expect(res.status).toBe(200);
    const profile = res.json as { radiusMm: number[]; relativeIntensity: number[] };
    expect(profile.radiusMm).toHaveLength(64);
    expect(profile.relativeIntensity[0]).toBeCloseTo(analysis.apertures[0].centreIntensityRatio, 6);
  });

  it("400 naming apertureId for an aperture that is not on the bench", async () => {
    const res = await call("POST", "/api/analyze/profile", cookie, { document: bench, apertureId: "nope" });
    expect(res.status).toBe(400);
    expect(fieldsOf(res.json)[0].path).toBe("apertureId");
  });

  it("finds screen positions for bright and dark centres downstream of the iris", async () => {
    const res = await call("POST", "/api/analyze/finder", cookie, { goal: "screen-positions", document: bench, apertureId: "iris", fromMm: 500, toMm: 3000 });
    expect(res.status).toBe(200);
    const found = res.json as { bright: { positionMm: number; zoneCount: number; centre: string }[]; dark: { positionMm: number; zoneCount: number; centre: string }[] };
    expect(found.bright.length).toBeGreaterThan(0);
    expect(found.dark.length).toBeGreaterThan(0);
    for (const c of found.bright) {
      expect(c.positionMm).toBeGreaterThanOrEqual(500);
      expect(c.positionMm).toBeLessThanOrEqual(3000);
      expect(c.zoneCount % 2).toBe(1); // odd zone count → bright centre
      expect(c.centre).toBe("bright");
    }
    for (const c of found.dark) {
      expect(c.zoneCount % 2).toBe(0);
      expect(c.centre).toBe("dark");
    }
  });

  it("400 for an unknown finder goal", async () => {
    const res = await call("POST", "/api/analyze/finder", cookie, { goal: "guess", document: bench });
    expect(res.status).toBe(400);
    expect(fieldsOf(res.json)[0].path).toBe("goal");
  });
});

describe("POST /api/safety", () => {
  it("classifies a 5 mW red pointer-class beam as 3R with an NOHD of about 21 m", async () => {
    // Worked by hand: MPE(0.25 s) = 1.8·0.25^0.75 mJ/cm² / 0.25 s = 2.546 mW/cm² (ANSI Z136.1-2014 Table 5a);
    // √(4P/(π·MPE)) = √(4·0.005/(π·0.002546)) = 1.581 cm; a = 1 mm/√2, φ = 1 mrad/√2 (1/e);
    // NOHD = (15.81 − 0.707) mm / 0.707 mrad = 21.36 m (ANSI Z136.1 Appendix B).
    const res = await call("POST", "/api/safety", cookie, { wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 1, divergenceMrad: 1 });
    expect(res.status).toBe(200);
    const body = res.json as { hazardClass: string; nohdM: number; mpeWPerCm2: number };
    expect(body.hazardClass).toBe("3R");
    expect(body.mpeWPerCm2).toBeCloseTo(2.546e-3, 6);
    expect(body.nohdM).toBeCloseTo(21.36, 1);
  });

  it("400 naming the field for a negative divergence", async () => {
    const res = await call("POST", "/api/safety", cookie, { wavelengthNm: 632.8, powerMw: 5, beamDiameterMm: 1, divergenceMrad: -1 });
    expect(res.status).toBe(400);
    expect(fieldsOf(res.json)[0].path).toBe("divergenceMrad");
  });
});
