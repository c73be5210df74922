// POST /api/analyze with version 2 documents (the optical table) over HTTP: paths and open beams for a folded bench with
// a splitter, and every bad input of the contract as a 400 naming the element, or a warning — never a 500 or a hang.
import { beforeAll, describe, expect, it } from "vitest";
import { call, DEMO, signIn } from "../support/http";

let cookie = "";
beforeAll(async () => {
  cookie = (await signIn(DEMO.researcher)).cookie;
});

const table = { widthMm: 1200, depthMm: 900, holePitchMm: 25 };
const laser = { id: "green", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1 };
const folded = (withBlock: boolean) => ({
  version: 2,
  title: "Folded bench with a splitter",
  table,
  elements: [
    laser,
    { id: "M1", kind: "mirror", xMm: 500, yMm: 100, angleDeg: 135 },
    { id: "BS", kind: "beam-splitter", xMm: 500, yMm: 400, angleDeg: 315, reflectance: 0.5 },
    { id: "iris", kind: "aperture", xMm: 800, yMm: 400, angleDeg: 180, diameterMm: 2 },
    { id: "screen", kind: "screen", xMm: 1100, yMm: 400, angleDeg: 180 },
    ...(withBlock ? [{ id: "block", kind: "beam-block", xMm: 500, yMm: 800, angleDeg: 270 }] : []),
  ],
});

type Path = { id: string; laserId: string; parentPathId: string | null; startElementId: string; powerMw: number; elementIds: string[]; end: Record<string, unknown> };
type Answer = {
  analysis: { version: 2; paths: Path[]; elements: { id: string; pathId: string }[]; apertures: { id: string; pathId: string; screenId: string | null }[]; warnings: { code: string; elementId?: string; message: string }[] };
  safety: { openBeams: { pathId: string; xMm: number; yMm: number; powerMw: number; exceedsMpe: boolean }[]; lasers: { laserId: string; hazardClass: string; lines: unknown[] }[]; warnings: { code: string; message: string }[] };
};
type Problem = { path: string; message: string };
const fieldsOf = (json: Record<string, unknown> | null) => ((json?.error as { fields: Problem[] }) ?? { fields: [] }).fields;

describe("POST /api/analyze with a table (version 2)", () => {
  it("traces the fold and both splitter arms and reports the arm that leaves the table as an open beam", async () => {
    const res = await call("POST", "/api/analyze", cookie, folded(false));
    expect(res.status).toBe(200);
    const { analysis, safety } = res.json as unknown as Answer;
    expect(analysis.version).toBe(2);
    expect(analysis.paths.map((p) => [p.id, p.startElementId, p.end])).toEqual([
      ["p1", "green", { continuesAs: ["p2"] }],
      ["p2", "M1", { continuesAs: ["p3", "p4"] }],
      ["p3", "BS", { elementId: "screen" }],
      ["p4", "BS", { edge: { xMm: 500, yMm: 900 } }],
    ]);
    expect(analysis.paths[2].elementIds).toEqual(["iris", "screen"]);
    expect(analysis.apertures).toEqual([expect.objectContaining({ id: "iris", pathId: "p3", screenId: "screen" })]);
    expect(analysis.elements.find((e) => e.id === "screen")?.pathId).toBe("p3");
    expect(safety.openBeams).toHaveLength(1);
    expect(safety.openBeams[0]).toMatchObject({ pathId: "p4", xMm: 500, yMm: 900, exceedsMpe: true });
    expect(safety.openBeams[0].powerMw).toBeCloseTo(20 * 0.99 * 0.5, 6);
    expect(safety.lasers).toEqual([expect.objectContaining({ laserId: "green", lines: [expect.anything()] })]);
    expect(safety.warnings.some((w) => w.code === "open-beam" && w.message.includes('"BS"'))).toBe(true);
  });

  it("has no open beam once a block stands in the splitter's other arm", async () => {
    const res = await call("POST", "/api/analyze", cookie, folded(true));
    expect(res.status).toBe(200);
    expect((res.json as unknown as Answer).safety.openBeams).toEqual([]);
  });

  it("warns about a laser aimed off the table and a ring of mirrors, in bounded time", async () => {
    const ring = {
      version: 2,
      table,
      elements: [
        { ...laser, xMm: 300, yMm: 100 },
        { id: "M1", kind: "mirror", xMm: 500, yMm: 100, angleDeg: 135, reflectance: 1 },
        { id: "M2", kind: "mirror", xMm: 500, yMm: 500, angleDeg: 225, reflectance: 1 },
        { id: "M3", kind: "mirror", xMm: 200, yMm: 500, angleDeg: 315, reflectance: 1 },
        { id: "M4", kind: "mirror", xMm: 200, yMm: 100, angleDeg: 45, reflectance: 1 },
        { id: "red", kind: "laser", xMm: 1000, yMm: 800, angleDeg: 90, wavelengthNm: 635, powerMw: 1, beamDiameterMm: 1 },
      ],
    };
    const res = await call("POST", "/api/analyze", cookie, ring);
    expect(res.status).toBe(200);
    const { analysis } = res.json as unknown as Answer;
    expect(analysis.warnings.find((w) => w.code === "trace-generation-limit")?.message).toMatch(/64/);
    expect(analysis.warnings.find((w) => w.code === "laser-aimed-off-table")?.elementId).toBe("red");
  });

  it("stops a grid of splitters at 2 000 segments with a warning", async () => {
    const elements: Record<string, unknown>[] = [{ ...laser, xMm: 20 }];
    for (let i = 0; i < 8; i++) for (let j = 0; j < 8; j++) elements.push({ id: `s${i}-${j}`, kind: "beam-splitter", xMm: 100 + 100 * i, yMm: 100 + 100 * j, angleDeg: 135, reflectance: 0.5 });
    const res = await call("POST", "/api/analyze", cookie, { version: 2, table, elements });
    expect(res.status).toBe(200);
    const { analysis } = res.json as unknown as Answer;
    expect(analysis.paths).toHaveLength(2000);
    expect(analysis.warnings.some((w) => w.code === "trace-path-limit")).toBe(true);
  });

  const base = folded(true);
  const cases: [string, unknown, string, RegExp][] = [
    ["an element off the table", { ...base, elements: [...base.elements, { id: "far", kind: "beam-block", xMm: 1300, yMm: 50, angleDeg: 0 }] }, "elements.6.xMm", /Beam block "far" .* is off the table/],
    ["two elements on the same spot", { ...base, elements: [...base.elements, { id: "twin", kind: "mirror", xMm: 500.2, yMm: 100, angleDeg: 45 }] }, "elements.6.xMm", /"twin" and mirror "M1" stand on the same spot/],
    ["a splitter reflectance above 1", { ...base, elements: base.elements.map((e) => (e.id === "BS" ? { ...e, reflectance: 1.5 } : e)) }, "elements.2.reflectance", /Beam splitter "BS": reflectance must be between 0 and 1/],
    ["a splitter reflectance below 0", { ...base, elements: base.elements.map((e) => (e.id === "BS" ? { ...e, reflectance: -0.1 } : e)) }, "elements.2.reflectance", /between 0 and 1/],
    ["more than 500 elements", { ...base, elements: [laser, ...Array.from({ length: 500 }, (_, i) => ({ id: `b${i}`, kind: "beam-block", xMm: 10 + (i % 50) * 20, yMm: 200 + Math.floor(i / 50) * 20, angleDeg: 0 }))] }, "elements", /at most 500 elements/],
    ["no table", { version: 2, elements: base.elements }, "table", /widthMm/],
    ["an unknown version", { ...base, version: 7 }, "version", /1 \(a straight rail\) or 2/],
    ["a mirror without a place", { ...base, elements: [laser, { id: "m", kind: "mirror", angleDeg: 0 }] }, "elements.1.xMm", /x must be a number/],
  ];
  for (const [name, body, path, message] of cases) {
    it(`400 for ${name}`, async () => {
      const res = await call("POST", "/api/analyze", cookie, body);
      expect(res.status).toBe(400);
      const problem = fieldsOf(res.json).find((f) => f.path === path);
      expect(problem?.message, JSON.stringify(fieldsOf(res.json))).toMatch(message);
    });
  }
});
