// The officer's conditions of a sign-off as lines the technician ticks (pure; no published source: presentation).

/** One line per line of the text or per "; "-separated clause, without trailing stops. */
export function conditionLines(conditions: string | null | undefined): string[] {
  return (conditions ?? "")
    .split(/\r?\n|;\s+/)
    .map((l) => l.trim().replace(/[.;]+$/, ""))
    .filter((l) => l.length > 0)
    .map((l) => l.charAt(0).toUpperCase() + l.slice(1));
}

