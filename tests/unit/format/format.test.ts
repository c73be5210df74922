// The one formatter for people: figures (Intl), dates in the lab's zone, the eyewear OD rule, plain engine text.
import { describe, expect, it } from "vitest";
import { computedOdText, endOfDayInZone, eyewearWords, formatDate, formatDateTime, formatNumber, nohdWords, plainText, wholeOdToWear } from "../../../lib/format";
import { conditionLines } from "../../../lib/build/conditions";

describe("formatNumber", () => {
  it("writes powers of ten with superscript exponents and keeps three significant figures", () => {
    expect(formatNumber(0.000254)).toBe("2.54 × 10⁻⁴");
    expect(formatNumber(3.2e9)).toBe("3.2 × 10⁹");
    expect(formatNumber(-1.5e-5)).toBe("-1.5 × 10⁻⁵");
  });
  it("separates thousands and rounds to significant figures", () => {
    expect(formatNumber(1234567)).toBe("1,230,000");
    expect(formatNumber(1400, { digits: 6 })).toBe("1,400");
    expect(formatNumber(0.0123456)).toBe("0.0123");
    expect(formatNumber(0)).toBe("0");
    expect(formatNumber(null)).toBe("—");
    expect(formatNumber(Infinity)).toBe("unbounded");
  });
});

describe("eyewear OD wording (one rule)", () => {
  it("states the computed need rounded up to two decimals and the eyewear as a whole OD rounded up", () => {
    // OD 1.3301 must never be stated below the need: 1.34, and eyewear of OD 2
    expect(computedOdText(1.3301)).toBe("1.34");
    expect(wholeOdToWear(1.3301)).toBe(2);
    const w = eyewearWords(1.33, 532);
    expect(w.wear).toBe("Wear eyewear of OD 2 or more at 532 nm");
    expect(w.need).toBe("computed need OD 1.33");
    expect(w.line).toBe("Wear eyewear of OD 2 or more at 532 nm (computed need OD 1.33)");
  });
  it("a tiny need still asks for OD 1; exactly 0 says no eyewear is needed for the direct beam", () => {
    expect(eyewearWords(0.0089).wholeOd).toBe(1);
    expect(eyewearWords(0.0089).need).toBe("computed need OD 0.01");
    expect(eyewearWords(0).wear).toBe("No eyewear needed for the direct beam");
    expect(eyewearWords(null).wholeOd).toBe(0);
    expect(wholeOdToWear(3)).toBe(3);
  });
  it("an NOHD of 0 reads as none — below the MPE", () => {
    expect(nohdWords(0, (v) => formatNumber(v))).toBe("none — below the MPE");
    expect(nohdWords(21.36, (v) => formatNumber(v))).toBe("21.4 m");
  });
});

describe("dates in the lab's time zone (Europe/London)", () => {
  it("ends a validity day at midnight on the lab's clocks, in winter (GMT) and in summer (BST = UTC+1)", () => {
    // UK civil time: GMT in January, BST (UTC+1) in July — the offset table of the IANA time zone database.
    expect(endOfDayInZone("2027-01-31", "Europe/London").toISOString()).toBe("2027-01-31T23:59:59.999Z");
    expect(endOfDayInZone("2027-07-01", "Europe/London").toISOString()).toBe("2027-07-01T22:59:59.999Z");
    expect(endOfDayInZone("2027-07-01", "Asia/Tokyo").toISOString()).toBe("2027-07-01T14:59:59.999Z");
    expect(() => endOfDayInZone("31/01/2027")).toThrow(/YYYY-MM-DD/);
  });
  it("writes one date format with the zone's name", () => {
    expect(formatDate("2027-07-01T22:59:59.999Z", "Europe/London")).toBe("1 Jul 2027");
    expect(formatDateTime("2026-12-02T14:05:00Z", "Europe/London")).toBe("2 Dec 2026, 14:05 GMT");
    expect(formatDateTime("2027-07-01T14:05:00Z", "Europe/London")).toBe("1 Jul 2027, 15:05 BST");
  });
});

describe("plain text from the engines", () => {
  it("removes file names and never says 'from memory'", () => {
    expect(plainText("docs/bench-document.md: OD = log10(E/MPE) over the limiting aperture")).toBe("OD = log10(E/MPE) over the limiting aperture");
    const t = plainText("ANSI Z136.1-2014 §4 control measures (signs; signal words recalled from memory)");
    expect(t).not.toMatch(/memory|recalled/);
    expect(t).toContain("not yet checked against the standard's text — confirm with your laser safety officer");
  });
});

describe("the officer's conditions as checklist lines", () => {
  it("splits on lines and semicolons, drops trailing stops", () => {
    expect(conditionLines("Eyewear OD 2 at 633 nm for everyone in the room; door interlock on.")).toEqual(["Eyewear OD 2 at 633 nm for everyone in the room", "Door interlock on"]);
    expect(conditionLines("One\nTwo;Three")).toEqual(["One", "Two;Three"]);
    expect(conditionLines(null)).toEqual([]);
  });
});
