// Coverage rules for eyewear on the lab's shelf (lib/safety/eyewear.ts).
// Sources beside each check: OD = −log10(τ) (ANSI Z136.1-2014 §4.6.2.5 and Appendix B); EN 207:2009 LB n ⇒ τ ≤ 10^−n (from memory);
// the independent check recomputes coverage from transmittance: eyewear is enough when E·τ ≤ MPE, i.e. τ ≤ 10^−OD_needed.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  bandProtectionOd,
  eyewearBandsSchema,
  eyewearCoverage,
  itemCovers,
  lineNeeds,
  protectionAt,
  type EyewearItem,
} from "@/lib/safety/eyewear";

const greenOnly: EyewearItem = { id: "g", name: "Green-only goggles", bands: [{ fromNm: 520, toNm: 540, opticalDensity: 6 }] };
const yag: EyewearItem = {
  id: "y",
  name: "Shelf pair B",
  bands: [
    { fromNm: 190, toNm: 400, opticalDensity: 5 },
    { fromNm: 400, toNm: 1000, opticalDensity: 2 },
    { fromNm: 1000, toNm: 1100, opticalDensity: 7, en207ScaleNumber: 5 },
  ],
};

describe("protection of one item at a wavelength", () => {
  it("reads the band that contains the wavelength, ends included", () => {
    expect(protectionAt(greenOnly, 532)?.opticalDensity).toBe(6);
    expect(protectionAt(greenOnly, 520)?.opticalDensity).toBe(6);
    expect(protectionAt(greenOnly, 540)?.opticalDensity).toBe(6);
    expect(protectionAt(greenOnly, 1064)).toBeNull();
  });

  it("takes the lower OD where two bands meet exactly at the wavelength (conservative choice)", () => {
    expect(protectionAt(yag, 400)?.opticalDensity).toBe(2);
    expect(protectionAt(yag, 1000)?.opticalDensity).toBe(2);
  });

  it("counts an EN 207 scale number LB n as OD n at most (EN 207:2009, from memory)", () => {
    expect(bandProtectionOd({ fromNm: 1000, toNm: 1100, opticalDensity: 7, en207ScaleNumber: 5 })).toBe(5);
    expect(bandProtectionOd({ fromNm: 1000, toNm: 1100, opticalDensity: 3, en207ScaleNumber: 5 })).toBe(3);
    expect(bandProtectionOd({ fromNm: 1000, toNm: 1100, opticalDensity: 3 })).toBe(3);
    expect(protectionAt(yag, 1064)?.opticalDensity).toBe(5);
  });

  it("covers when the OD is at least the OD needed, and never at a wavelength outside its bands", () => {
    expect(itemCovers(yag, 1064, 4.9)).toBe(true);
    expect(itemCovers(yag, 1064, 5)).toBe(true);
    expect(itemCovers(yag, 1064, 5.01)).toBe(false);
    expect(itemCovers(greenOnly, 1064, 0.5)).toBe(false);
    // OD needed ≤ 0: the exposure never exceeds the MPE, so no eyewear is needed (ANSI Z136.1-2014 Appendix B, OD = log10(H/MPE)).
    expect(itemCovers(greenOnly, 1064, 0)).toBe(true);
  });
});

describe("coverage of a bench's lines", () => {
  it("a frequency-doubled laser: green goggles cover 532 nm but not the 1064 nm residual", () => {
    const c = eyewearCoverage(
      [greenOnly, yag],
      [
        { laserId: "L", wavelengthNm: 532, opticalDensityRequired: 4.2, label: "main" },
        { laserId: "L", wavelengthNm: 1064, opticalDensityRequired: 3.1, label: "line 2" },
      ],
    );
    expect(c.lines[0].status).toBe("covered");
    expect(c.lines[0].coveredBy.map((i) => i.name)).toEqual(["Green-only goggles"]);
    expect(c.lines[0].shortOf.map((i) => i.name)).toEqual(["Shelf pair B"]);
    expect(c.lines[1].status).toBe("covered");
    expect(c.lines[1].coveredBy.map((i) => i.id)).toEqual(["y"]);
    // No single item covers both lines.
    expect(c.coversAll).toEqual([]);
    expect(c.everyLineCovered).toBe(true);
  });

  it("says when none of the lab's items covers a line", () => {
    const c = eyewearCoverage([greenOnly], [{ laserId: "L", wavelengthNm: 1064, opticalDensityRequired: 2 }]);
    expect(c.lines[0].status).toBe("not-covered");
    expect(c.lines[0].coveredBy).toEqual([]);
    expect(c.everyLineCovered).toBe(false);
  });

  it("with no eyewear at all, a line that needs OD is not covered and one that does not is fine", () => {
    const c = eyewearCoverage([], [
      { laserId: "L", wavelengthNm: 633, opticalDensityRequired: 0 },
      { laserId: "L", wavelengthNm: 633, opticalDensityRequired: 0.3 },
    ]);
    expect(c.lines.map((l) => l.status)).toEqual(["none-needed", "not-covered"]);
  });

  it("never claims coverage when the engine gave no figure", () => {
    const c = eyewearCoverage([yag], [{ laserId: "L", wavelengthNm: 1064, opticalDensityRequired: null }]);
    expect(c.lines[0].status).toBe("unknown");
    expect(c.lines[0].coveredBy).toEqual([]);
    expect(c.everyLineCovered).toBe(false);
    expect(c.coversAll).toEqual([]);
  });

  it("names items covering every line at once", () => {
    const c = eyewearCoverage([greenOnly, yag], [
      { laserId: "L", wavelengthNm: 355, opticalDensityRequired: 4 },
      { laserId: "L", wavelengthNm: 1064, opticalDensityRequired: 4 },
    ]);
    expect(c.coversAll).toEqual([{ id: "y", name: "Shelf pair B" }]);
  });
});

describe("independent check from transmittance, and monotonic properties", () => {
  const band = fc
    .tuple(fc.double({ min: 180, max: 2000, noNaN: true }), fc.double({ min: 1, max: 500, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true }))
    .map(([from, width, od]) => ({ fromNm: from, toNm: from + width, opticalDensity: od }));
  const item = fc.tuple(fc.array(band, { minLength: 1, maxLength: 4 }), fc.nat(1000)).map(([bands, n]): EyewearItem => ({ id: `i${n}`, name: `Item ${n}`, bands }));

  it("covers exactly when the transmitted exposure is at most the MPE (τ = 10^−OD; E·τ ≤ MPE ⇔ OD ≥ log10(E/MPE))", () => {
    fc.assert(
      fc.property(item, fc.double({ min: 180, max: 2500, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true }), (it, λ, odNeeded) => {
        // Independent method: the worst transmittance over every band containing λ, compared in linear units.
        const τs = it.bands.filter((b) => λ >= b.fromNm && λ <= b.toNm).map((b) => 10 ** -b.opticalDensity);
        const E = 10 ** odNeeded; // exposure in units of the MPE
        const expected = τs.length > 0 && E * Math.max(...τs) <= 1 * (1 + 1e-12);
        expect(itemCovers(it, λ, odNeeded)).toBe(expected);
      }),
    );
  });

  it("a higher OD needed never gains coverage; adding an item never loses it", () => {
    fc.assert(
      fc.property(fc.array(item, { maxLength: 4 }), item, fc.double({ min: 180, max: 2500, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true }), (items, extra, λ, od, more) => {
        const base = eyewearCoverage(items, [{ laserId: "L", wavelengthNm: λ, opticalDensityRequired: od }]).lines[0];
        const higher = eyewearCoverage(items, [{ laserId: "L", wavelengthNm: λ, opticalDensityRequired: od + more }]).lines[0];
        expect(higher.coveredBy.length).toBeLessThanOrEqual(base.coveredBy.length);
        const withExtra = eyewearCoverage([...items, { ...extra, id: "extra" }], [{ laserId: "L", wavelengthNm: λ, opticalDensityRequired: od }]).lines[0];
        expect(withExtra.coveredBy.length).toBeGreaterThanOrEqual(base.coveredBy.length);
      }),
    );
  });

  it("adding a line never adds to the items that cover every line", () => {
    fc.assert(
      fc.property(fc.array(item, { minLength: 1, maxLength: 4 }), fc.double({ min: 180, max: 2500, noNaN: true }), fc.double({ min: 0.1, max: 8, noNaN: true }), fc.double({ min: 180, max: 2500, noNaN: true }), fc.double({ min: 0.1, max: 8, noNaN: true }), (items, λ1, od1, λ2, od2) => {
        const one = eyewearCoverage(items, [{ laserId: "L", wavelengthNm: λ1, opticalDensityRequired: od1 }]);
        const two = eyewearCoverage(items, [
          { laserId: "L", wavelengthNm: λ1, opticalDensityRequired: od1 },
          { laserId: "L", wavelengthNm: λ2, opticalDensityRequired: od2 },
        ]);
        for (const i of two.coversAll) expect(one.coversAll.map((x) => x.id)).toContain(i.id);
      }),
    );
  });
});

describe("validation of an item's bands (every message names its field)", () => {
  const issues = (v: unknown) => {
    const r = eyewearBandsSchema.safeParse(v);
    return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
  };

  it("accepts touching bands and refuses overlapping ones", () => {
    expect(issues([{ fromNm: 190, toNm: 400, opticalDensity: 5 }, { fromNm: 400, toNm: 700, opticalDensity: 2 }])).toEqual([]);
    const overlap = issues([{ fromNm: 500, toNm: 600, opticalDensity: 5 }, { fromNm: 550, toNm: 700, opticalDensity: 2 }]);
    expect(overlap).toHaveLength(1);
    expect(overlap[0].path).toBe("1.fromNm");
    expect(overlap[0].message).toMatch(/Bands \(bands\) overlap: 550–700 nm overlaps 500–600 nm/);
  });

  it("refuses an empty band, a from ≥ to, no bands, an OD outside 0–10 and a bad scale number", () => {
    expect(issues([])[0].message).toMatch(/Bands \(bands\): give at least one/);
    expect(issues([{ fromNm: 600, toNm: 600, opticalDensity: 2 }])[0]).toMatchObject({ path: "0.toNm", message: expect.stringMatching(/Band end \(toNm\) must be greater/) });
    expect(issues([{ fromNm: 700, toNm: 600, opticalDensity: 2 }])[0].path).toBe("0.toNm");
    expect(issues([{ fromNm: 500, toNm: 600, opticalDensity: 10.5 }])[0]).toMatchObject({ path: "0.opticalDensity", message: expect.stringMatching(/at most 10/) });
    expect(issues([{ fromNm: 500, toNm: 600, opticalDensity: -1 }])[0]).toMatchObject({ path: "0.opticalDensity", message: expect.stringMatching(/at least 0/) });
    expect(issues([{ fromNm: 500, toNm: 600, opticalDensity: "4" }])[0].message).toMatch(/Optical density \(opticalDensity\) must be a number/);
    expect(issues([{ fromNm: 500, toNm: 600, opticalDensity: 4, en207ScaleNumber: 4.5 }])[0]).toMatchObject({ path: "0.en207ScaleNumber" });
    expect(issues([{ fromNm: 100, toNm: 600, opticalDensity: 4 }])[0]).toMatchObject({ path: "0.fromNm", message: expect.stringMatching(/at least 180 nm/) });
  });
});

describe("the lines a bench's hazard answer gives", () => {
  const governing = { opticalDensityRequired: 3.2 } as never;
  it("one line from today's answer: the laser's wavelength with the highest OD on the bench", () => {
    expect(lineNeeds({ laserId: "L", wavelengthNm: 532, governing })).toEqual([{ laserId: "L", wavelengthNm: 532, opticalDensityRequired: 3.2, label: "main line" }]);
    expect(lineNeeds({ laserId: "L", wavelengthNm: 532, governing: null })[0].opticalDensityRequired).toBe(0);
  });
  it("per-line figures where the answer has lasers with lines; the main line never below the bench's highest OD", () => {
    const safety = {
      laserId: "L",
      wavelengthNm: 532,
      governing,
      lasers: [{ laserId: "L", lines: [{ wavelengthNm: 532, opticalDensityRequired: 2.5 }, { wavelengthNm: 1064, opticalDensityRequired: 1.1 }, { wavelengthNm: 808, opticalDensityRequired: null }] }],
    };
    expect(lineNeeds(safety).map((l) => [l.wavelengthNm, l.opticalDensityRequired, l.label])).toEqual([
      [532, 3.2, "main line"],
      [1064, 1.1, "line 2"],
      [808, null, "line 3"],
    ]);
  });
});

describe("the rail assessment's per-line figures (lines.lines and points[].lines)", () => {
  it("takes, per line, the highest OD over every point and the free beam", () => {
    const safety = {
      laserId: "L",
      wavelengthNm: 532,
      governing: { opticalDensityRequired: 4 },
      lines: { lines: [{ wavelengthNm: 532, main: true, opticalDensityRequired: 2 }, { wavelengthNm: 1064, main: false, opticalDensityRequired: 1.5 }] },
      points: [
        { lines: [{ wavelengthNm: 532, opticalDensityRequired: 3.9 }, { wavelengthNm: 1064, opticalDensityRequired: 2.7 }] },
        { lines: [{ wavelengthNm: 532, opticalDensityRequired: 0 }, { wavelengthNm: 1064, opticalDensityRequired: 0.1 }] },
      ],
    };
    expect(lineNeeds(safety).map((l) => [l.wavelengthNm, l.opticalDensityRequired, l.label])).toEqual([
      [532, 3.9, "main line"],
      [1064, 2.7, "line 2"],
    ]);
    // Without per-point figures the main line takes the bench's highest OD; a further line keeps its own.
    const bare = { ...safety, points: [] };
    expect(lineNeeds(bare).map((l) => l.opticalDensityRequired)).toEqual([4, 1.5]);
  });
});
