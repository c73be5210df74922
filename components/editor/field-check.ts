// The check behind each number field of the properties panel: the element's schema, and for a laser's power left empty
// the cross-field rule (empty only for a single pulse given by its energy). Pure, so it is unit-tested.
import { checkLaserFields, type BenchElement, type LaserElement } from "@/lib/bench/schema";
import { ELEMENT_SCHEMAS } from "./element-kinds";

/** The sentence for `value` in field `key` of `element`, or null when it may be committed. */
export function checkField(element: BenchElement, key: string) {
  return (value: number | undefined): string | null => {
    const candidate = { ...element, [key]: value } as Record<string, unknown>;
    if (value === undefined) delete candidate[key];
    const result = ELEMENT_SCHEMAS[element.kind].safeParse(candidate);
    if (!result.success) return result.error.issues.find((i) => i.path[0] === key)?.message ?? null;
    // a laser's power may be left empty only for a single pulse given by its energy (the cross-field rules)
    if (element.kind === "laser" && key === "powerMw" && value === undefined) {
      let problem: string | null = null;
      checkLaserFields(result.data as LaserElement, { addIssue: (i) => void (problem ??= i.path[0] === key ? i.message : null) });
      return problem;
    }
    return null;
  };
}
