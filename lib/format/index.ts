// Formatting for people: numbers (Intl, superscript exponents), dates in the lab's time zone, eyewear OD wording,
// and the plain words of the product's vocabulary. No published source: presentation only.
export * from "./number";
export * from "./date";
export * from "./eyewear";
export * from "./words";
