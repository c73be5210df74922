// The one record per element kind: every kind of both schemas has one, the readers take their names from it, and the
// shares it sends on never create light (energy conservation; window shares per the bench document contract: (1−r)², r, r(1−r)²).
import { describe, expect, it } from "vitest";
import { branchesOf, ELEMENT_KIND_RECORDS, kindWord } from "@/lib/bench/element-kinds";
import { kindNoun, kindTitle } from "@/lib/bench/kinds";
import { ELEMENT_KINDS } from "@/lib/bench/schema";
import { TABLE_ELEMENT_KINDS, type TableElement } from "@/lib/bench/schema-v2";
import { KIND_INFO } from "@/components/editor/element-kinds";

describe("element kind records", () => {
  it("cover every kind of version 2, and the rail kinds are exactly version 1's", () => {
    expect(Object.keys(ELEMENT_KIND_RECORDS).sort()).toEqual([...TABLE_ELEMENT_KINDS].sort());
    expect(TABLE_ELEMENT_KINDS.filter((k) => ELEMENT_KIND_RECORDS[k].onRail)).toEqual([...ELEMENT_KINDS]);
  });
  it("give the names the sheets, the review and the editor print", () => {
    for (const k of TABLE_ELEMENT_KINDS) {
      expect(kindTitle(k)).toBe(ELEMENT_KIND_RECORDS[k].label);
      expect(kindNoun(k)).toBe(kindWord(k));
    }
    for (const k of ELEMENT_KINDS) {
      expect(KIND_INFO[k].label).toBe(ELEMENT_KIND_RECORDS[k].label);
      expect(KIND_INFO[k].fields.slice(1)).toEqual(ELEMENT_KIND_RECORDS[k].fields);
    }
    expect(kindTitle("beam-splitter")).toBe("Beam splitter");
    expect(kindNoun("prism")).toBe("prism");
  });
  it("send on no more power than arrives", () => {
    const place = { xMm: 0, yMm: 0, angleDeg: 0 };
    const cases: TableElement[] = [
      { id: "m", kind: "mirror", ...place },
      { id: "b", kind: "beam-splitter", ...place, reflectance: 0.37 },
      { id: "w", kind: "window", ...place },
      { id: "w2", kind: "window", ...place, reflectancePerSurface: 0.5 },
    ];
    for (const e of cases) {
      const total = branchesOf(e).reduce((s, b) => s + b.share, 0);
      expect(total, e.id).toBeLessThanOrEqual(1 + 1e-12);
    }
    const r = 0.04;
    const window = branchesOf(cases[2]).map((b) => b.share);
    [(1 - r) ** 2, r, r * (1 - r) ** 2].forEach((share, i) => expect(window[i]).toBeCloseTo(share, 15));
    expect(branchesOf(cases[1]).map((b) => [b.direction, b.share])).toEqual([["reflected", 0.37], ["straight", 1 - 0.37]]);
    expect(branchesOf({ id: "b0", kind: "beam-splitter", ...place, reflectance: 0 })).toEqual([{ direction: "straight", share: 1, role: "transmitted" }]);
  });
});
