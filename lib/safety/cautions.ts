// The caution catalogue, as versioned data: which controls each hazard class, wavelength band and bench situation calls for.
// Based on the control measures of ANSI Z136.1-2014 §4 and IEC 60825-1:2014 (user guidance) plus marked common lab practice; texts are our own words.

import { type HazardClass, type WavelengthBand, wavelengthBand } from "./types";

export const CAUTION_CATALOGUE_VERSION = "1.0.0";

/** Appended to every caution shown: the tool advises; the LSO and local rules decide. */
export const CAUTION_FOOTER =
  "The institution's laser safety officer and local regulations have the final word on every control listed here; Benchwarden advises and never authorises work on its own.";

export type CautionSituation =
  /** Light leaves the last element of the bench without being stopped. */
  | "open-beam-end"
  /** A screen stands in the beam. */
  | "screen-in-beam"
  /** A lens brings the beam to a focus, or the laser is used with focusing optics. */
  | "focusing-optics"
  /** The required eyewear OD is above 0 somewhere. */
  | "eyewear-needed"
  | "pulsed";

export type CautionBasis = "standard" | "common practice";

export type CautionEntry = {
  id: string;
  /** The entry applies when every listed field matches (a field left out matches anything). */
  appliesWhen: {
    classes?: readonly HazardClass[];
    bands?: readonly WavelengthBand[];
    situations?: readonly CautionSituation[];
  };
  title: string;
  /** May hold {od} and {wavelengthNm}, filled in when selected. */
  text: string;
  basis: CautionBasis;
  reference: string;
};

const ABOVE_1 = ["1M", "2", "2M", "3R", "3B", "4"] as const;
const ABOVE_2M = ["3R", "3B", "4"] as const;
const HIGH = ["3B", "4"] as const;

export const CAUTION_CATALOGUE: readonly CautionEntry[] = [
  {
    id: "eyewear-od",
    appliesWhen: { situations: ["eyewear-needed"] },
    title: "Laser eyewear rated for this wavelength",
    text: "Wherever the beam may reach an eye, wear protective eyewear marked with an optical density of at least {od} at {wavelengthNm} nm. Check the marking for this exact wavelength; eyewear made for another laser may offer no protection at all.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (protective eyewear); EN 207 for eyewear marking in Europe",
  },
  {
    id: "beam-termination",
    appliesWhen: { classes: ABOVE_1 },
    title: "Stop the beam at every end",
    text: "End every beam path on a beam block, including behind screens and cameras, which can pass or reflect part of the light. No beam may leave the table or the enclosure unstopped.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (beam path control)",
  },
  {
    id: "open-beam-end",
    appliesWhen: { situations: ["open-beam-end"] },
    title: "This bench has an open beam end",
    text: "Light leaves the last element of this bench without being stopped. Add a beam block at the end of the path before switching the laser on.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (beam path control)",
  },
  {
    id: "screen-backstop",
    appliesWhen: { situations: ["screen-in-beam"], classes: ABOVE_1 },
    title: "Put a beam block behind the screen",
    text: "A screen scatters and may transmit part of the beam. Mount a beam block directly behind it and keep its surface matte, so no strong reflection returns toward the bench.",
    basis: "common practice",
    reference: "Common practice",
  },
  {
    id: "beam-height",
    appliesWhen: { classes: ABOVE_1 },
    title: "Keep beams below seated eye level",
    text: "Run every beam horizontally and well below the eye level of a person sitting at the bench; never direct a beam upward or across a walkway.",
    basis: "common practice",
    reference: "Common practice; ANSI Z136.1-2014 §4 control measures (beam height)",
  },
  {
    id: "no-reflective-items",
    appliesWhen: { classes: ABOVE_2M },
    title: "No reflective jewellery or tools in the beam area",
    text: "Remove rings, watches and bracelets, and keep shiny tools away from the beam path; a stray reflection can be as hazardous as the direct beam.",
    basis: "common practice",
    reference: "Common practice; ANSI Z136.1-2014 §4 control measures (specular reflections)",
  },
  {
    id: "alignment-low-power",
    appliesWhen: { classes: ABOVE_1 },
    title: "Align at the lowest practical power",
    text: "Do alignment with the laser at the lowest power that still lets you see the beam, or with a low-power alignment laser, and with eyewear on; most laser eye injuries happen during alignment.",
    basis: "common practice",
    reference: "Common practice; ANSI Z136.1-2014 §4 control measures (alignment procedures)",
  },
  {
    id: "sign-caution",
    appliesWhen: { classes: ["2", "2M"] },
    title: "Warning sign: CAUTION",
    text: "Post a laser sign with the signal word CAUTION at the entrance to the area, stating the class and the wavelength.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (signs; signal words not yet checked against the standard's text — confirm with your laser safety officer)",
  },
  {
    id: "sign-warning",
    appliesWhen: { classes: ABOVE_2M },
    title: "Warning sign: WARNING (DANGER where required)",
    text: "Post a laser sign with the signal word WARNING at every entrance, stating the class, wavelength and power; some institutions and older rules require DANGER for Class 4 — use the word your local rules specify.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (signs; signal words not yet checked against the standard's text — confirm with your laser safety officer)",
  },
  {
    id: "engineering-controls",
    appliesWhen: { classes: HIGH },
    title: "Interlocks, key switch and a controlled area",
    text: "Operate the laser only in a laser controlled area with restricted entry, with its key switch removed when not in use and with entry or enclosure interlocks working. Let no one enter without authorisation and the right eyewear.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (engineering controls); IEC 60825-1:2014 engineering specifications (key control, remote interlock connector)",
  },
  {
    id: "sop-and-approval",
    appliesWhen: { classes: HIGH },
    title: "Written procedure and safety officer approval",
    text: "Work to a written standard operating procedure approved by the laser safety officer before the laser is switched on; local rules may ask the same for lower classes too.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (administrative controls, SOP)",
  },
  {
    id: "local-rules-sop",
    appliesWhen: { classes: ["1M", "2", "2M", "3R"] },
    title: "Check whether local rules ask for a procedure",
    text: "Some institutions require a written procedure and the safety officer's approval for this class as well. Ask before you start.",
    basis: "common practice",
    reference: "Common practice",
  },
  {
    id: "class4-skin-fire",
    appliesWhen: { classes: ["4"] },
    title: "Skin and fire hazards",
    text: "This beam can burn skin and ignite paper, cloth, cables and solvents. Keep flammable material out of the beam path, use non-flammable beam blocks rated for the power, and never put a hand in the beam.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures and §7 non-beam hazards (fire)",
  },
  {
    id: "class4-diffuse",
    appliesWhen: { classes: ["4"] },
    title: "Diffuse reflections are hazardous too",
    text: "At this power even light scattered from a matte surface can exceed the eye limit within the nominal hazard zone; wear eyewear whenever the beam is open.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 Appendix B (diffuse reflection NHZ)",
  },
  {
    id: "invisible-beam",
    appliesWhen: { bands: ["uv", "near-ir", "far-ir"], classes: ABOVE_1 },
    title: "The beam is invisible",
    text: "You cannot see this beam or its reflections and there is no blink reflex to protect you. Trace it only with a viewing card or camera, enclose the path where you can, and assume every surface in the path may reflect it.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 §4 control measures (invisible beams)",
  },
  {
    id: "viewing-optics",
    appliesWhen: { classes: ["1M", "2M"] },
    title: "No viewing through optics",
    text: "Do not look into the beam through binoculars, telescopes, microscopes or magnifiers: collecting optics can make this beam hazardous.",
    basis: "standard",
    reference: "IEC 60825-1:2014 (Class 1M and 2M)",
  },
  {
    id: "focusing-optics",
    appliesWhen: { situations: ["focusing-optics"], classes: ABOVE_1 },
    title: "A focus raises the hazard",
    text: "Near a focus the irradiance is far higher than in the raw beam; keep eyes, skin and flammable material away from focal points, and block the diverging beam beyond them.",
    basis: "standard",
    reference: "ANSI Z136.1-2014 Appendix B (lens-on-laser hazard)",
  },
  {
    id: "class1-conditions",
    appliesWhen: { classes: ["1"] },
    title: "Class 1 only as assessed",
    text: "This beam is estimated Class 1 as it leaves the laser. Opening a housing, removing a fibre or adding focusing or collecting optics can change that; assess again after any such change.",
    basis: "standard",
    reference: "IEC 60825-1:2014 (Class 1 conditions)",
  },
  {
    id: "pulsed",
    appliesWhen: { situations: ["pulsed"] },
    title: "Pulsed emission",
    text: "A single pulse can injure before you can react. Check that the eyewear is rated for the pulse duration and peak power as well as for the wavelength.",
    basis: "standard",
    reference: "EN 207 (pulse ratings of eyewear); ANSI Z136.1-2014 §8.2.3 (repetitive pulses)",
  },
];

export type SelectedCaution = {
  id: string;
  title: string;
  text: string;
  basis: CautionBasis;
  reference: string;
  /** The same sentence on every caution: the LSO and local rules decide. */
  finalSay: string;
  catalogueVersion: string;
};

export type CautionContext = {
  hazardClass: HazardClass;
  wavelengthNm: number;
  situations: readonly CautionSituation[];
  opticalDensityRequired: number;
};

/** Round an OD up to one decimal, so the stated OD is never below the computed need. */
export function statedOd(od: number): string {
  return (Math.ceil(od * 10 - 1e-9) / 10).toFixed(1);
}

export function selectCautions(context: CautionContext): SelectedCaution[] {
  const band = wavelengthBand(context.wavelengthNm);
  const applies = (e: CautionEntry) =>
    (e.appliesWhen.classes === undefined || e.appliesWhen.classes.includes(context.hazardClass)) &&
    (e.appliesWhen.bands === undefined || e.appliesWhen.bands.includes(band)) &&
    (e.appliesWhen.situations === undefined || e.appliesWhen.situations.some((s) => context.situations.includes(s)));
  return CAUTION_CATALOGUE.filter(applies).map((e) => ({
    id: e.id,
    title: e.title,
    text: e.text.replaceAll("{od}", statedOd(context.opticalDensityRequired)).replaceAll("{wavelengthNm}", String(context.wavelengthNm)),
    basis: e.basis,
    reference: e.reference,
    finalSay: CAUTION_FOOTER,
    catalogueVersion: CAUTION_CATALOGUE_VERSION,
  }));
}
