// The one cautions list of every screen: the eyewear caution left out (the one eyewear line says it), the count in the
// heading matching what is listed, texts in plain words, open only where it stands as a panel of its own.
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { CautionList } from "@/components/ui/caution-list";

const cautions = [
  { id: "eyewear-od", title: "Eyewear", text: "Wear eyewear of OD 0.0089 or more", reference: "common practice" },
  { id: "beam-height", title: "Keep beams below seated eye level", text: "Run every beam horizontally.", reference: "common practice" },
  { id: "block", title: "Stop the beam at every end", text: "Every path ends on a beam block.", reference: "common practice" },
];

describe("the cautions list", () => {
  it("leaves the eyewear caution to the eyewear line and counts what it lists", () => {
    const html = renderToStaticMarkup(createElement(CautionList, { cautions }));
    expect(html).toContain("Cautions (2)");
    expect(html).toContain("Keep beams below seated eye level.");
    expect(html).toContain("Stop the beam at every end.");
    expect(html).not.toContain("OD 0.0089");
    expect(html).not.toMatch(/<details[^>]*open/);
  });
  it("stands open as a panel on the review screens, and is absent when there is nothing to list", () => {
    expect(renderToStaticMarkup(createElement(CautionList, { cautions, boxed: true }))).toMatch(/<details[^>]*open/);
    expect(renderToStaticMarkup(createElement(CautionList, { cautions: cautions.slice(0, 1) }))).toBe("");
  });
});
