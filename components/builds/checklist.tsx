"use client";
// The as-built checklist: each element's measured position (the server says whether it is within the
// stated tolerance), each control and the eyewear ticked. Flags carry a word and a shape, not colour alone.
import { useState } from "react";
import { CoverageList, type CoverageData } from "@/components/eyewear/coverage-list";
import { fieldError } from "@/lib/api/client";
import type { BuildView } from "@/lib/api/contracts/builds";
import { HazardNotes } from "@/components/ui/hazard-notes";
import { useCheck } from "./build-queries";

type Item = BuildView["checklist"][number];

function ToleranceFlag({ item, toleranceMm }: { item: Item; toleranceMm: number }) {
  if (item.expectedPositionMm === null || item.measuredPositionMm === null) return null;
  const off = Number((item.measuredPositionMm - item.expectedPositionMm).toFixed(2));
  return item.withinTolerance ? (
    <span className="text-ok" data-testid={`tolerance-${item.elementId}`}>✓ within ±{toleranceMm} mm ({off >= 0 ? "+" : ""}{off} mm)</span>
  ) : (
    <span className="font-semibold text-danger" data-testid={`tolerance-${item.elementId}`} role="alert">
      ✕ Out of tolerance: {off >= 0 ? "+" : ""}{off} mm from the drawn {item.expectedPositionMm} mm (allowed ±{toleranceMm} mm)
    </span>
  );
}

function Row({ buildId, item, editable, toleranceMm }: { buildId: string; item: Item; editable: boolean; toleranceMm: number }) {
  const check = useCheck(buildId);
  const [measured, setMeasured] = useState(item.measuredPositionMm === null ? "" : String(item.measuredPositionMm));
  const [problem, setProblem] = useState<string | null>(null);
  const inputId = `measured-${item.itemKey}`;
  const saveMeasured = () => {
    const value = measured.trim() === "" ? null : Number(measured.replace(",", "."));
    if (value !== null && !Number.isFinite(value)) {
      setProblem("Enter the measured position as a number of millimetres, e.g. 401.5");
      return;
    }
    setProblem(null);
    if (value === item.measuredPositionMm) return;
    check.mutate({ itemKey: item.itemKey, measuredPositionMm: value });
  };
  return (
    <li className={`flex flex-col gap-2 rounded-lg border bg-panel p-3 ${item.withinTolerance === false ? "border-danger" : "border-line"}`} data-testid={`check-${item.itemKey}`}>
      <div className="flex flex-wrap items-start gap-3">
        <label className="flex min-h-11 flex-1 cursor-pointer items-start gap-3">
          <input
            type="checkbox"
            className="mt-1 h-6 w-6 shrink-0 accent-[var(--color-accent)]"
            checked={item.done}
            disabled={!editable || check.isPending}
            onChange={(e) => check.mutate({ itemKey: item.itemKey, done: e.target.checked })}
          />
          <span>
            <span className="font-medium">{item.label}</span>
            <span className="block text-sm text-muted">{item.detail}</span>
          </span>
        </label>
        {item.expectedPositionMm !== null ? (
          <div className="flex flex-col gap-1">
            <label htmlFor={inputId} className="text-sm text-muted">
              Measured position of {item.elementId} (mm)
            </label>
            <input
              id={inputId}
              inputMode="decimal"
              className="min-h-11 w-36 rounded-md border border-line bg-ink px-3 text-lg text-text"
              value={measured}
              disabled={!editable}
              onChange={(e) => setMeasured(e.target.value)}
              onBlur={saveMeasured}
              onKeyDown={(e) => {
                if (e.key === "Enter") saveMeasured();
              }}
            />
          </div>
        ) : null}
      </div>
      <ToleranceFlag item={item} toleranceMm={toleranceMm} />
      {problem ? <p role="alert" className="text-sm text-danger">{problem}</p> : null}
      {check.error ? <p role="alert" className="text-sm text-danger">{fieldError(check.error, "measuredPositionMm") ?? check.error.message}</p> : null}
    </li>
  );
}

export function Checklist({ build, eyewear = null }: { build: BuildView; eyewear?: CoverageData | null }) {
  const groups: { title: string; group: Item["group"] }[] = [
    { title: "Elements at their positions", group: "element" },
    { title: "Controls in place", group: "control" },
    { title: "Conditions of the sign-off", group: "condition" },
    { title: "Eyewear", group: "eyewear" },
  ];
  const done = build.checklist.filter((c) => c.done).length;
  return (
    <div className="flex flex-col gap-4" data-testid="checklist">
      <p className="text-muted">
        {done} of {build.checklist.length} ticked.{" "}
        {build.checklist.some((c) => c.expectedPositionMm !== null)
          ? `Each element must sit within ±${build.tolerance.positionMm} mm of its drawn position, measured along the beam.`
          : "Each element stands on the hole and at the angle given (the hole numbered from the front left corner, the angle counter-clockwise from the +x direction)."}
      </p>
      {groups.filter((g) => build.checklist.some((c) => c.group === g.group)).map((g) => (
        <section key={g.group} className="flex flex-col gap-2">
          <h3 className="font-semibold">{g.title}</h3>
          {g.group === "eyewear" && eyewear ? <CoverageList data={eyewear} /> : null}
          <ul className="flex flex-col gap-2">
            {build.checklist
              .filter((c) => c.group === g.group)
              .map((c) => (
                <Row key={c.itemKey} buildId={build.id} item={c} editable={build.may.record} toleranceMm={build.tolerance.positionMm} />
              ))}
          </ul>
        </section>
      ))}
      <HazardNotes />
    </div>
  );
}
