// The table plan: geometry worked by hand (outline corners of a turned mirror, hole counts) and the drawing's markup
// (every path drawn, open beams marked, bands from the safety answer).
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { analyzeBench } from "@/lib/optics";
import { assessBench } from "@/lib/safety";
import { tablePlan } from "@/components/table/table-plan-geometry";
import { numberedHoles, TablePlan } from "@/components/table/table-plan";

const doc: BenchDocumentV2 = {
  version: 2,
  table: { widthMm: 600, depthMm: 450, holePitchMm: 25 },
  elements: [
    { id: "L", kind: "laser", xMm: 50, yMm: 100, angleDeg: 0, wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1 },
    { id: "M", kind: "mirror", xMm: 300, yMm: 100, angleDeg: 135 },
    { id: "BS", kind: "beam-splitter", xMm: 300, yMm: 300, angleDeg: 315, reflectance: 0.5 },
    { id: "B", kind: "beam-block", xMm: 550, yMm: 300, angleDeg: 180 },
  ],
};

describe("table plan", () => {
  const analysis = analyzeBench(doc);
  const safety = assessBench(doc, analysis);
  it("outlines a mirror turned to 135° as a 25.4 × 6 mm rectangle about its centre", () => {
    const plan = tablePlan(doc, analysis, safety);
    const m = plan.elements.find((e) => e.id === "M");
    // corners at centre ± 3 mm along the normal (−1, 1)/√2 ± 12.7 mm along the face (−1, −1)/√2
    const s = Math.SQRT1_2;
    const expected = [
      [-3, -12.7],
      [3, -12.7],
      [3, 12.7],
      [-3, 12.7],
    ].map(([u, v]) => [300 + u * -s + v * -s, 100 + u * s + v * -s]);
    m?.corners.forEach((c, i) => {
      expect(c.xMm).toBeCloseTo(expected[i][0], 9);
      expect(c.yMm).toBeCloseTo(expected[i][1], 9);
    });
    // holes from 12.5 mm every 25 mm: 24 columns across 600 mm, 18 rows across 450 mm
    expect(plan.holes).toEqual({ columns: 24, rows: 18, offsetMm: 12.5 });
  });
  it("colours each path by the safety answer and marks the open splitter port", () => {
    const plan = tablePlan(doc, analysis, safety);
    expect(plan.beams.map((b) => b.pathId)).toEqual(analysis.paths.map((p) => p.id));
    const open = plan.beams.filter((b) => b.open);
    expect(open.map((b) => b.band)).toEqual(["above-mpe"]);
    expect(plan.openBeams).toHaveLength(1);
    expect(tablePlan(doc, analysis, null).beams.every((b) => b.band === "unknown")).toBe(true);
  });
  it("renders on the server with every beam, element and open beam", () => {
    const html = renderToStaticMarkup(createElement(TablePlan, { doc, analysis, safety }));
    for (const p of analysis.paths) expect(html).toContain(`data-path-id="${p.id}"`);
    for (const e of doc.elements) expect(html).toContain(`data-element-id="${e.id}"`);
    expect(html).toContain("data-open-beam=");
    expect(html).toContain("leaves the table (circled)");
    expect(html).not.toMatch(/⟨/);
  });

  it("numbers the holes along the front and left edges on request: the first, every fifth, and a last one far from a fifth", () => {
    expect(numberedHoles(24)).toEqual([1, 5, 10, 15, 20, 24]);
    expect(numberedHoles(18)).toEqual([1, 5, 10, 15, 18]);
    expect(numberedHoles(21)).toEqual([1, 5, 10, 15, 20]);
    // the 600 × 450 mm table at 25 mm holes, the first half a pitch in: 24 columns, 18 rows
    const html = renderToStaticMarkup(createElement(TablePlan, { doc, analysis, safety, holeNumbers: true, labelMm: 26 }));
    const numbers = html.slice(html.indexOf('data-testid="hole-numbers"'));
    const written = [...numbers.matchAll(/<text[^>]*>(\d+)<\/text>/g)].map((m) => Number(m[1]));
    expect(written).toEqual([1, 5, 10, 15, 20, 24, 1, 5, 10, 15, 18]);
    // column 24 stands at x = 12.5 + 23 × 25 = 587.5 mm; labels at the size asked for (and the numbers a little smaller)
    expect(numbers).toContain('x="587.5"');
    expect(html).toMatch(/font-size="26"/);
    expect(renderToStaticMarkup(createElement(TablePlan, { doc, analysis, safety }))).not.toContain("hole-numbers");
  });
});
