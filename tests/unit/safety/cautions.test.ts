// The caution catalogue: versioned data, coverage of the controls issue 4 lists, selection by class, band and situation.
// Controls after ANSI Z136.1-2014 §4 and IEC 60825-1:2014 (from memory); entries marked "common practice" are lab practice, not a standard's text.
import { describe, expect, it } from "vitest";
import { CAUTION_CATALOGUE, CAUTION_CATALOGUE_VERSION, CAUTION_FOOTER, selectCautions, statedOd } from "@/lib/safety/cautions";
import type { HazardClass } from "@/lib/safety/types";

const ids = (hazardClass: HazardClass, wavelengthNm = 532, situations: Parameters<typeof selectCautions>[0]["situations"] = []) =>
  selectCautions({ hazardClass, wavelengthNm, situations, opticalDensityRequired: 2.04 }).map((c) => c.id);

describe("catalogue", () => {
  it("is versioned data with unique ids and a footer naming the LSO and local regulations", () => {
    expect(CAUTION_CATALOGUE_VERSION).toMatch(/^\d+\.\d+\.\d+$/);
    expect(new Set(CAUTION_CATALOGUE.map((c) => c.id)).size).toBe(CAUTION_CATALOGUE.length);
    expect(CAUTION_FOOTER).toMatch(/institution's laser safety officer and local regulations have the final word/);
    for (const c of CAUTION_CATALOGUE) {
      expect(c.title.length).toBeGreaterThan(5);
      expect(c.text.length).toBeGreaterThan(40);
      expect(c.reference.length).toBeGreaterThan(5);
    }
  });

  it("covers every control issue 4 lists", () => {
    const all = CAUTION_CATALOGUE.map((c) => `${c.title} ${c.text}`).join("\n");
    expect(all).toMatch(/optical density of at least \{od\} at \{wavelengthNm\} nm/);
    expect(all).toMatch(/beam block/i);
    expect(all).toMatch(/behind screens/);
    expect(all).toMatch(/below seated eye level/i);
    expect(all).toMatch(/jewellery/i);
    expect(all).toMatch(/lowest practical power/i);
    expect(all).toMatch(/signal word CAUTION/);
    expect(all).toMatch(/signal word WARNING/);
    expect(all).toMatch(/interlocks/i);
    expect(all).toMatch(/key switch/i);
    expect(all).toMatch(/controlled area/i);
    expect(all).toMatch(/standard operating procedure/i);
    expect(all).toMatch(/burn skin/);
    expect(all).toMatch(/ignite/);
    expect(all).toMatch(/invisible/i);
    expect(all).toMatch(/binoculars, telescopes/);
  });

  it("marks lab-practice entries as common practice", () => {
    // common practice: beams below eye level, alignment at the lowest power
    const basis = (id: string) => CAUTION_CATALOGUE.find((c) => c.id === id)?.basis;
    expect(basis("beam-height")).toBe("common practice");
    expect(basis("alignment-low-power")).toBe("common practice");
  });
});

describe("selection", () => {
  it("Class 3B and 4 get interlocks/key/controlled area and the SOP with LSO approval", () => {
    for (const c of ["3B", "4"] as const) expect(ids(c)).toEqual(expect.arrayContaining(["engineering-controls", "sop-and-approval", "sign-warning"]));
    expect(ids("3R")).not.toContain("engineering-controls");
    expect(ids("3R")).toContain("local-rules-sop");
  });
  it("Class 4 adds skin and fire hazards", () => {
    expect(ids("4")).toContain("class4-skin-fire");
    expect(ids("3B")).not.toContain("class4-skin-fire");
  });
  it("1M and 2M warn about viewing optics", () => {
    expect(ids("1M")).toContain("viewing-optics");
    expect(ids("2M")).toContain("viewing-optics");
    expect(ids("2")).not.toContain("viewing-optics");
  });
  it("Class 2 and 2M signs say CAUTION; 3R and above WARNING", () => {
    expect(ids("2")).toContain("sign-caution");
    expect(ids("2")).not.toContain("sign-warning");
    expect(ids("3R")).toContain("sign-warning");
  });
  it("UV and IR get the invisible-beam caution; visible does not", () => {
    expect(ids("3B", 355)).toContain("invisible-beam");
    expect(ids("3B", 1064)).toContain("invisible-beam");
    expect(ids("3B", 10_600)).toContain("invisible-beam");
    expect(ids("3B", 532)).not.toContain("invisible-beam");
  });
  it("situations add eyewear with the stated OD, open-beam-end and screen cautions", () => {
    const chosen = selectCautions({ hazardClass: "3B", wavelengthNm: 1064, situations: ["eyewear-needed", "open-beam-end", "screen-in-beam"], opticalDensityRequired: 2.04 });
    expect(chosen.find((c) => c.id === "eyewear-od")?.text).toMatch(/at least 2\.1 at 1064 nm/);
    expect(chosen.map((c) => c.id)).toEqual(expect.arrayContaining(["open-beam-end", "screen-backstop"]));
    for (const c of chosen) {
      expect(c.finalSay).toBe(CAUTION_FOOTER);
      expect(c.catalogueVersion).toBe(CAUTION_CATALOGUE_VERSION);
    }
  });
  it("the stated OD is rounded up, never down", () => {
    expect(statedOd(2.01)).toBe("2.1");
    expect(statedOd(2)).toBe("2.0");
    expect(statedOd(0)).toBe("0.0");
  });
});
