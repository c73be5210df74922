// Traceability (issue item 7): every figure the hazard engine hands to a screen or the sheet names its clause, and any
// text naming a standard's table or clause says, once put into words for people (lib/format plainText), that it is
// "not yet checked against the standard's text — confirm with your laser safety officer"; never "from memory", never a
// file name. The list of table values with their clauses and status is docs/hazard-values.md. No published value here.
import { describe, expect, it } from "vitest";
import type { BenchDocument } from "@/lib/bench/schema";
import type { BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { limitationText, plainText } from "@/lib/format";
import { analyzeBench } from "@/lib/optics";
import { assessBeam, assessBench, classifyBeam, LIMITATIONS } from "@/lib/safety";
import { UNCHECKED, type StandardId } from "@/lib/safety/types";

const CLAUSE = /ANSI Z136\.1-2014|IEC 60825-1:2014|EN 207|Directive 2006\/25\/EC/;
const FILE_NAME = /\b[\w-]+\.(?:ts|tsx|md|mjs|json)\b|\blib\/|\bcomponents\//;

/** Every string in an engine answer, with the key it sits under. */
function strings(value: unknown, key = "", out: { key: string; text: string }[] = []): { key: string; text: string }[] {
  if (typeof value === "string") out.push({ key, text: value });
  else if (Array.isArray(value)) for (const v of value) strings(v, key, out);
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) strings(v, k, out);
  return out;
}

// Keys whose text is machinery, not words for people (ids, codes, enum values, the engine's name in a stored summary).
const NOT_WORDS = new Set(["id", "code", "kind", "elementId", "laserId", "pathId", "where", "governing", "governingSite", "governingRule", "rule", "standard", "unit", "hazardClass", "labelClass", "group", "mechanism", "site", "condition", "catalogueVersion", "role", "afterElementId", "startElementId", "governingLimit"]);

function checkWords(answer: unknown) {
  for (const { key, text } of strings(answer)) {
    if (NOT_WORDS.has(key)) continue;
    const words = plainText(text);
    expect(words, `${key}: ${words}`).not.toMatch(/from memory|\brecalled\b/i);
    expect(words, `${key}: ${words}`).not.toMatch(FILE_NAME);
    // A text naming a standard's clause as the origin of a figure says it is not yet checked against the text.
    if (/source$/i.test(key) && CLAUSE.test(words)) expect(words, `${key}: ${words}`).toContain(UNCHECKED);
  }
}

const rail = (laser: Record<string, unknown>): BenchDocument => ({
  version: 1,
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, beamDiameterMm: 2, ...laser } as BenchDocument["elements"][number],
    { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: 50 },
    { id: "screen-1", kind: "screen", positionMm: 400 },
  ],
});

const LASERS: [string, Record<string, unknown>][] = [
  ["visible CW", { wavelengthNm: 632.8, powerMw: 5 }],
  ["UV CW", { wavelengthNm: 355, powerMw: 50 }],
  ["far IR CW", { wavelengthNm: 10600, powerMw: 20000 }],
  ["1310 nm CW (C_C and the corneal stand-in)", { wavelengthNm: 1310, powerMw: 10 }],
  ["single pulse", { wavelengthNm: 1064, pulseEnergyJ: 0.2, pulseDurationS: 8e-9 }],
  ["train with a residual line", { wavelengthNm: 532, pulseEnergyJ: 5e-3, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10, lines: [{ wavelengthNm: 1064, powerMw: 20 }] }],
  ["bursts", { wavelengthNm: 1064, pulseEnergyJ: 1e-5, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, pulsesPerBurst: 10, burstPulseRateHz: 1e6 }],
  ["femtosecond train", { wavelengthNm: 800, powerMw: 2000, pulseDurationS: 1e-13, pulseRepetitionRateHz: 8e7 }],
];

describe("every figure names its clause and says it is not yet checked", () => {
  for (const standard of ["ANSI Z136.1-2014", "IEC 60825-1:2014"] as StandardId[]) {
    for (const [name, laser] of LASERS) {
      it(`${name}, ${standard}: the bench assessment`, () => {
        const doc = rail(laser);
        const safety = assessBench(doc, analyzeBench(doc), { standard });
        checkWords(safety);
        // the figures the screens show beside each value
        for (const f of [safety.mpe, safety.laser.figures.hazardClass, safety.laser.figures.nohd, safety.laser.figures.opticalDensity, safety.laser.figures.limitingAperture]) {
          expect(plainText(f.source)).toMatch(/ANSI Z136\.1-2014|IEC 60825-1:2014|OD = log10/);
        }
        for (const f of [safety.mpe, safety.laser.figures.nohd, safety.laser.figures.limitingAperture]) expect(plainText(f.source)).toContain(UNCHECKED);
        for (const line of safety.lines.lines) expect(plainText(line.assessment.figures.mpe.source)).toContain(UNCHECKED);
        if (safety.laser.pulsedMpe) expect(plainText(safety.laser.pulsedMpe.source)).toContain(UNCHECKED);
      });
    }
  }

  it("the class estimate (the register's and the label check's) says the limits are not yet checked", () => {
    for (const [, laser] of LASERS) {
      const { lines: _l, ...beam } = laser;
      const c = classifyBeam({ divergenceMrad: 1, beamDiameterMm: 2, ...beam } as Parameters<typeof classifyBeam>[0]);
      checkWords(c);
      expect(plainText(c.source)).toContain(UNCHECKED);
      expect(c.conditions.unchecked).toContain(UNCHECKED);
    }
  });

  it("assessBeam alone (POST /api/safety) under both standards", () => {
    for (const standard of ["ANSI Z136.1-2014", "IEC 60825-1:2014"] as StandardId[]) {
      const a = assessBeam({ wavelengthNm: 1064, pulseEnergyJ: 1e-3, pulseDurationS: 1e-9, pulseRepetitionRateHz: 1000, beamDiameterMm: 3, divergenceMrad: 1, standard });
      checkWords(a);
      expect(plainText(a.figures.mpe.source)).toContain(UNCHECKED);
    }
  });

  it("a table: every laser's line figures name their sources and say they are not yet checked", () => {
    const doc: BenchDocumentV2 = {
      version: 2,
      table: { widthMm: 1000, depthMm: 600, holePitchMm: 25 },
      elements: [
        { id: "Y", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 532, pulseEnergyJ: 5e-3, pulseDurationS: 8e-9, pulseRepetitionRateHz: 10, beamDiameterMm: 6, lines: [{ wavelengthNm: 1064, powerMw: 20 }] },
        { id: "M", kind: "mirror", xMm: 500, yMm: 100, angleDeg: 135 },
        { id: "S", kind: "screen", xMm: 500, yMm: 500, angleDeg: 270 },
      ],
    };
    for (const standard of ["ANSI Z136.1-2014", "IEC 60825-1:2014"] as StandardId[]) {
      const safety = assessBench(doc, analyzeBench(doc), { standard });
      checkWords(safety);
      for (const line of safety.lasers.flatMap((l) => l.lines)) {
        expect(plainText(line.mpeSource)).toContain(UNCHECKED);
        expect(plainText(line.nohdSource)).toContain(UNCHECKED);
      }
    }
  });

  it("the scope list beside every hazard result says the table values are not yet checked, in the same words", () => {
    const unchecked = LIMITATIONS.find((l) => l.id === "unchecked-values")!;
    expect(limitationText(unchecked)).toContain(UNCHECKED);
    for (const l of LIMITATIONS) expect(limitationText(l)).not.toMatch(/from memory|\brecalled\b|\.ts\b/);
  });
});
