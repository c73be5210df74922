// The rail's drawing at scale on the build sheet: every word stays inside the drawing's width, however long the rail
// and its scale bar; the names of crowded elements take rows of their own instead of overlapping.
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import { ScaleDrawing } from "@/components/sheets/scale-drawing";

const PAPER_WIDTH_MM = 176;
/** Bold 3.6 mm text is about 2.0 mm per character in the sheet's face (the drawing's own estimate). */
const CHAR_MM = 2.0;

function crowded(lengthMm: number): BenchDocument {
  const kinds = ["lens", "filter", "aperture", "lens", "aperture", "lens", "filter", "aperture", "lens", "screen"] as const;
  const at = [0.02, 0.03, 0.04, 0.14, 0.15, 0.29, 0.3, 0.31, 0.57, 1];
  return {
    version: 1,
    elements: [
      { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 633, powerMw: 1, beamDiameterMm: 0.8 },
      ...kinds.map((kind, i) => ({ id: `${kind}-${i + 1}`, kind, positionMm: Math.round(at[i] * lengthMm), focalLengthMm: 100, opticalDensity: 1, diameterMm: 2 })),
    ] as BenchDocument["elements"],
  };
}

describe("the scale drawing", () => {
  for (const lengthMm of [140, 1400, 14_000]) {
    it(`keeps the scale sentence inside the drawing on a ${lengthMm} mm rail`, () => {
      const svg = renderToStaticMarkup(createElement(ScaleDrawing, { doc: crowded(lengthMm) }));
      const words = /<text x="([\d.]+)"[^>]*>((?:<tspan[^>]*>)?Scale 1:.*?)<\/text>/.exec(svg.replaceAll("<!-- -->", ""));
      expect(words).not.toBeNull();
      // each line of the sentence (its tspans, or the whole text when it is one line) ends inside the paper width
      const tspans = [...words![2].matchAll(/<tspan x="([\d.]+)"[^>]*>([^<]*)<\/tspan>/g)].map((m) => ({ x: Number(m[1]), text: m[2] }));
      const lines = tspans.length ? tspans : [{ x: Number(words![1]), text: words![2].replace(/<[^>]+>/g, "") }];
      for (const line of lines) expect(line.x + line.text.length * CHAR_MM, line.text).toBeLessThanOrEqual(PAPER_WIDTH_MM);
      expect(words![2]).toContain("heights not to scale");
    });
  }
  it("puts neighbours' names on different rows", () => {
    const svg = renderToStaticMarkup(createElement(ScaleDrawing, { doc: crowded(1400) }));
    const names = [...svg.matchAll(/<text x="([\d.]+)" y="([\d.]+)" text-anchor="middle" font-size="3.6" font-weight="700"[^>]*>([^<]+)<\/text>/g)].map((m) => ({ x: Number(m[1]), y: Number(m[2]), id: m[3] }));
    expect(names.length).toBe(11);
    for (const a of names)
      for (const b of names) {
        if (a === b || a.y !== b.y) continue;
        const gap = Math.abs(a.x - b.x) - ((a.id.length + b.id.length) * 2.1) / 2;
        expect(gap, `${a.id} and ${b.id}`).toBeGreaterThan(0);
      }
  });
});
