import { fmt } from "@/components/review/format";
import { displayedCautions } from "@/components/ui/cautions";
import { capitalise, CENTRE_WORDS, eyewearWords, formatDate, formatDateTime, HAZARD_LABELS, nohdWords, ONE_OVER_E_NOTE, plainText, limitationText } from "@/lib/format";
import { FINAL_SAY, LIMITATIONS } from "@/lib/safety";
import { isTableSheet, type SheetContent, type TableSheetContent } from "@/lib/build/sheet";
import { PrintTableSheet } from "./print-table-sheet";
import type { CoverageData } from "@/components/eyewear/coverage-list";
import { PrintCoverage, PrintStandard } from "@/components/eyewear/print-coverage";
import { ProfilePlot } from "./profile-plot";
import { PrintPulseRegime } from "@/components/review/pulse-regime";
import { regimeRows } from "@/lib/format/pulse-regime";
import { ScaleDrawing } from "./scale-drawing";

// The printed build sheet: black on white, big type for reading at the bench with gloves on, every figure
// with its unit. Page 1 identity, drawing and parts; then build order, predictions, safety and approval.
export const SHEET_CSS = `
@page { margin: 16mm 15mm 18mm 15mm; }
html, body { background: #fff !important; color: #000 !important; }
/* The app's own font (Inter, shipped from the @fontsource-variable/inter npm package), so the sheet
   prints the same on every machine whatever fonts the system has. */
html, body, .sheet svg { font-family: "Inter Variable", sans-serif; }
body { font-size: 12.5pt; line-height: 1.35; -webkit-print-color-adjust: exact; print-color-adjust: exact; }
.sheet { max-width: 186mm; margin: 0 auto; color: #000; }
.sheet a { color: #000; }
.sheet h1 { font-size: 22pt; font-weight: 800; margin: 0; line-height: 1.15; }
.sheet h2 { font-size: 16pt; font-weight: 800; margin: 0 0 3mm; border-bottom: 0.6mm solid #000; padding-bottom: 1mm; break-after: avoid; }
.sheet h3 { break-after: avoid; }
.sheet h3 { font-size: 13.5pt; font-weight: 700; margin: 3mm 0 1.5mm; }
.sheet section { margin-bottom: 6mm; }
.sheet .page { break-before: page; }
.sheet table { width: 100%; border-collapse: collapse; font-size: 11.5pt; }
.sheet th, .sheet td { border: 0.3mm solid #000; padding: 1.4mm 2mm; text-align: left; vertical-align: top; }
.sheet th { background: #e8e8e8; font-weight: 700; }
.sheet tr { break-inside: avoid; }
.sheet .num { font-variant-numeric: tabular-nums; white-space: nowrap; }
.sheet .big { font-size: 15pt; font-weight: 800; }
.sheet .mono { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 10.5pt; overflow-wrap: anywhere; }
/* a hash is read and compared as one unbroken string: small enough to fit the column on one line */
.sheet .hash { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 8.6pt; white-space: nowrap; letter-spacing: -0.1pt; }
.sheet .nowrap { white-space: nowrap; }
.sheet .scope { font-size: 9.5pt; margin: 1mm 0 0; padding-left: 5mm; }
.sheet .scope li { margin-bottom: 0.8mm; break-inside: avoid; }
.sheet .box { border: 0.5mm solid #000; padding: 3mm; border-radius: 1.5mm; break-inside: avoid; }
.sheet .warn { border: 0.8mm solid #000; background: #f2f2f2; padding: 3mm; font-weight: 700; break-inside: avoid; }
.sheet .grid2 { display: grid; grid-template-columns: 1fr 1fr; gap: 4mm; }
.sheet .head { display: grid; grid-template-columns: 1fr 36mm; gap: 5mm; align-items: start; margin-bottom: 4mm; }
.sheet .qr svg { width: 36mm; height: 36mm; display: block; }
.sheet .steps { list-style: none; padding: 0; margin: 0; counter-reset: step; }
.sheet .steps > li { counter-increment: step; position: relative; padding: 1.5mm 0 2mm 13mm; border-bottom: 0.2mm solid #999; break-inside: avoid; }
.sheet .steps > li::before { content: counter(step); position: absolute; left: 0; top: 1mm; width: 9mm; height: 9mm; border: 0.6mm solid #000; border-radius: 50%; text-align: center; font-weight: 800; font-size: 13pt; line-height: 8.2mm; }
.sheet .steps p { margin: 0.5mm 0 0; }
.sheet .tick { display: inline-block; width: 7mm; height: 7mm; border: 0.5mm solid #000; }
.sheet .write { display: inline-block; min-width: 26mm; border-bottom: 0.3mm solid #000; height: 6mm; }
.sheet .aperture { break-inside: avoid; margin-bottom: 5mm; }
.sheet .aperture-figs { display: grid; grid-template-columns: 58mm 1fr; gap: 4mm; align-items: start; }
.sheet .ring { width: 58mm; height: 58mm; border-radius: 50%; display: block; border: 0.4mm solid #000; image-rendering: auto; }
.sheet .profile-plot { width: 100%; height: auto; }
.sheet .scale-drawing { margin: 0 0 3mm; }
.sheet .scale-drawing figcaption { font-size: 11pt; margin-top: 1mm; }
.sheet dl.facts { display: grid; grid-template-columns: 45mm 1fr; gap: 1.2mm 3mm; margin: 0; }
.sheet dl.facts dt { font-weight: 700; }
.sheet dl.facts dd { margin: 0; }
.sheet .cautions li { margin-bottom: 2mm; break-inside: avoid; }
@media screen { body { padding: 10mm; } }
`;


function RegisterLine({ register }: { register: SheetContent["register"] }) {
  if (!register) return <div style={{ fontSize: "10.5pt", marginTop: "1mm" }}>Laser register: not linked — ask the laser safety officer which registered laser this is.</div>;
  const e = register.entry;
  if (!e) return <div style={{ fontSize: "10.5pt", marginTop: "1mm", fontWeight: 700 }}>Laser register entry {register.registerId} was not found — ask the laser safety officer before using any laser.</div>;
  return (
    <div style={{ fontSize: "10.5pt", marginTop: "1mm" }}>
      <strong>Laser register:</strong> {e.model}
      {e.serialNumber ? `, S/N ${e.serialNumber}` : ""}, label Class {e.labelClass}, {e.wavelengthsNm.join("/")} nm, max {e.maxPowerMw} mW{e.location ? `, ${e.location}` : ""} ({e.status})
    </div>
  );
}

function day(d: Date | string | null | undefined): string {
  return formatDate(d);
}

/** What arrives on each screen the light reaches (the engine's analysis.screens): power, centre and its ratio. */
export function ScreenFigures({ screens }: { screens: readonly { id: string; pathId?: string; powerMw: number; centre: string | null; centreIntensityRatio: number | null; positionMm?: number }[] }) {
  return (
    <div style={{ marginBottom: "4mm" }} data-testid="sheet-screens">
      <h3>On each screen</h3>
      <table>
        <thead>
          <tr>
            <th>Screen</th>
            <th>Power arriving</th>
            <th>Centre of the pattern</th>
            <th>Centre intensity</th>
          </tr>
        </thead>
        <tbody>
          {screens.map((s) => (
            <tr key={`${s.id}-${s.pathId ?? ""}`}>
              <td>
                <strong>{s.id}</strong>
                {s.pathId ? ` (beam ${s.pathId})` : s.positionMm !== undefined ? ` (${s.positionMm} mm)` : ""}
              </td>
              <td className="num">{fmt(s.powerMw)} mW</td>
              <td>{s.centre ? (CENTRE_WORDS[s.centre as keyof typeof CENTRE_WORDS] ?? s.centre) : "—"}</td>
              <td className="num">{s.centreIntensityRatio !== null ? `×${fmt(s.centreIntensityRatio)} of the open beam` : "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

type SheetIdentity = Pick<SheetContent, "revision" | "decision" | "qrSvg" | "verifyUrl">;

/** Page 1's head: the bench, the revision and its sign-off, the content hash and the QR code of the online record. */
export function SheetHead({ sheet }: { sheet: SheetIdentity }) {
  const { revision, decision } = sheet;
  return (
    <header className="head">
      <div>
        <p style={{ margin: 0, fontSize: "12pt" }}>Build sheet · {revision.labName}</p>
        <h1>{revision.benchTitle}</h1>
        <p className="big" style={{ margin: "2mm 0" }}>
          Revision {revision.number} · {revision.status === "valid" ? "SIGNED OFF" : revision.status === "expired" ? "SIGN-OFF EXPIRED — DO NOT BUILD" : "REPLACED — DO NOT BUILD"}
        </p>
        <p style={{ margin: 0 }}>
          Signed off by <strong>{decision?.signerName ?? "—"}</strong> on <strong className="nowrap">{day(decision?.decidedAt)}</strong>
          {decision?.validUntil ? (
            <>
              {" "}
              · valid until <strong className="nowrap">{day(decision.validUntil)}</strong>
            </>
          ) : null}{" "}
          · drawn by {revision.authorName}
        </p>
        <p style={{ margin: "2mm 0 0" }}>
          Content hash (SHA-256):
          <br />
          <span className="hash" data-testid="sheet-hash">
            {revision.contentHash}
          </span>
        </p>
      </div>
      <div className="qr" aria-label="QR code linking to the online record">
        <div dangerouslySetInnerHTML={{ __html: sheet.qrSvg }} />
        <p style={{ fontSize: "9pt", margin: "1mm 0 0", textAlign: "center" }}>Scan to check the online record</p>
      </div>
    </header>
  );
}

/** The approval box that closes every sheet. */
export function ApprovalBox({ sheet }: { sheet: SheetIdentity }) {
  const { revision, decision } = sheet;
  return (
    <section className="box">
      <h2>Approval</h2>
      <dl className="facts">
        <dt>Officer</dt>
        <dd>
          {decision?.signerName ?? "—"}
          {decision ? `, ${decision.signerRole}` : ""}
        </dd>
        <dt>Signed on</dt>
        <dd className="nowrap">{decision ? formatDateTime(decision.decidedAt) : "—"}</dd>
        <dt>Meaning</dt>
        <dd>{decision?.meaning ?? "—"}</dd>
        <dt>Conditions</dt>
        <dd>{decision?.conditions || "None"}</dd>
        <dt>Valid until</dt>
        <dd className="nowrap">{decision?.validUntil ? `${day(decision.validUntil)} (to the end of that day)` : "No end date"}</dd>
        <dt>Revision</dt>
        <dd>
          {revision.number} of “{revision.benchTitle}”, {revision.labName}
        </dd>
        <dt>Content hash</dt>
        <dd className="hash">{revision.contentHash}</dd>
        <dt>Check online</dt>
        <dd className="mono">{sheet.verifyUrl}</dd>
      </dl>
      <p style={{ margin: "3mm 0 0" }}>
        The figures on this sheet are advice. Work is authorised by the sign-off above, under its conditions, for as long as it is valid.
      </p>
      <p style={{ margin: "3mm 0 0", fontWeight: 700 }}>Uncontrolled when printed — check the online record before use (scan the QR code on page 1).</p>
    </section>
  );
}

export function PrintSheet({ sheet, paper, eyewear = null }: { sheet: SheetContent | TableSheetContent; paper: "A4" | "Letter"; eyewear?: CoverageData | null }) {
  if (isTableSheet(sheet)) return <PrintTableSheet sheet={sheet} paper={paper} eyewear={eyewear} />;
  return <RailSheet sheet={sheet} paper={paper} eyewear={eyewear} />;
}

function RailSheet({ sheet, paper, eyewear = null }: { sheet: SheetContent; paper: "A4" | "Letter"; eyewear?: CoverageData | null }) {
  const { revision, decision, safety, analysis } = sheet;
  const governing = safety?.governing ?? null;
  const od = governing?.opticalDensityRequired ?? 0;
  const wavelength = sheet.laser?.wavelengthNm;
  const eyewearText = eyewearWords(od, wavelength);
  const cautions = safety ? displayedCautions(safety.cautions) : [];
  const laser = sheet.laser;
  return (
    <div className="sheet" data-print-ready="" data-paper={paper}>
      <style dangerouslySetInnerHTML={{ __html: SHEET_CSS }} />

      {/* ── Page 1: identity, drawing, parts ───────────────────────────────────────────── */}
      <SheetHead sheet={sheet} />
      {decision?.conditions ? (
        <p className="warn">Conditions of the sign-off: {decision.conditions}</p>
      ) : null}
      {revision.status !== "valid" ? <p className="warn">{revision.statusSentence}</p> : null}

      <section>
        <h2>The bench, at scale</h2>
        <ScaleDrawing doc={sheet.document} />
      </section>

      <section>
        <h2>Parts list</h2>
        <table>
          <thead>
            <tr>
              <th>Element</th>
              <th>Position</th>
              <th>From laser</th>
              <th>Settings</th>
            </tr>
          </thead>
          <tbody>
            {sheet.parts.map((p) => (
              <tr key={p.id}>
                <td>
                  <strong>{p.id}</strong>
                  <br />
                  {p.kindWord}
                </td>
                {/* positions as the ruler reads them, the same digits as the build order (no grouping) */}
                <td className="num big">{p.positionMm} mm</td>
                <td className="num">{Number(p.fromLaserMm.toFixed(2))} mm</td>
                <td>
                  {p.settings}
                  {p.kind === "laser" ? <RegisterLine register={sheet.register} /> : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <p style={{ margin: "2mm 0 0" }}>
          Place every element within <strong>±{sheet.toleranceMm} mm</strong> of its position.
        </p>
      </section>

      {/* ── Build order and the paper checklist (flows on after the parts list: a forced page break here left
          page 2 nearly empty whenever the parts list ran over page 1) ──────────────────────────────────── */}
      <section>
        <h2>Build order</h2>
        <ol className="steps">
          {sheet.steps.map((s, i) => (
            <li key={i}>
              <strong style={{ fontSize: "13.5pt" }}>{s.title}</strong>
              {s.lines.map((l, j) => (
                <p key={j}>{l}</p>
              ))}
            </li>
          ))}
        </ol>
      </section>

      <section>
        <h2>As-built checklist (also in Benchwarden)</h2>
        <p style={{ margin: "0 0 2mm" }}>Each element within ±{sheet.toleranceMm} mm of its position; each control as described on the safety page; each condition of the sign-off.</p>
        <table>
          <thead>
            <tr>
              <th style={{ width: "11mm" }}>Done</th>
              <th>Item</th>
              <th style={{ width: "36mm" }}>Measured position</th>
            </tr>
          </thead>
          <tbody>
            {sheet.checklist.map((c) => (
              <tr key={c.itemKey}>
                <td>
                  <span className="tick" />
                </td>
                <td>
                  <strong>{c.label}</strong>
                  {c.group === "eyewear" || c.group === "condition" ? <div style={{ fontSize: "10.5pt" }}>{c.detail}</div> : null}
                </td>
                <td>{c.expectedPositionMm !== null ? <span className="write" /> : "—"} {c.expectedPositionMm !== null ? "mm" : ""}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      {/* ── Predictions (flow on after the checklist: a forced page break here left a page nearly empty) ── */}
      <section>
        <h2>What you should see</h2>
        {sheet.problem ? <p className="warn">The predictions cannot be computed for this drawing: {sheet.problem}</p> : null}
        {sheet.screen && !sheet.apertures.some((a) => a.screenId === sheet.screen?.screenId) ? (
          <p>
            On <strong>{sheet.screen.screenId}</strong> ({sheet.screen.positionMm} mm): beam diameter <strong className="num">{fmt(sheet.screen.beamDiameterMm)} mm</strong> (1/e²), power arriving{" "}
            <strong className="num">{fmt(sheet.screen.powerMw)} mW</strong>.
          </p>
        ) : null}
        {sheet.apertures.length === 0 ? <p>There is no aperture that the light reaches, so no diffraction pattern is predicted.</p> : null}
        {sheet.apertures.map((a) => (
          <div className="aperture" key={a.id}>
            <h3>
              Aperture {a.id} (⌀ {a.diameterMm} mm at {a.positionMm} mm){a.screenId ? ` seen on ${a.screenId}, ${fmt(a.observationDistanceMm)} mm away` : " — no screen (far field)"}
            </h3>
            <p className="big" style={{ margin: "0 0 2mm" }}>
              Expect a {CENTRE_WORDS[a.centre]} — {fmt(a.fresnelNumber)} half-period zones
            </p>
            <table style={{ marginBottom: "3mm" }}>
              <tbody>
                <tr>
                  <th>Centre intensity</th>
                  <td className="num">×{fmt(a.centreIntensityRatio)} of the open beam there</td>
                  <th>Light through</th>
                  <td className="num">{fmt(a.transmittedFraction * 100)} %</td>
                </tr>
                <tr>
                  <th>Pattern diameter</th>
                  <td className="num">{a.spotDiameterMm !== null ? `${fmt(a.spotDiameterMm)} mm` : "—"}</td>
                  <th>Power at the screen</th>
                  <td className="num">{a.screenPowerMw !== null ? `${fmt(a.screenPowerMw)} mW` : "—"}</td>
                </tr>
              </tbody>
            </table>
            {a.profile ? (
              <div className="aperture-figs">
                <figure style={{ margin: 0 }}>
                  {/* A data-URL PNG on a page chromium prints: next/image would neither optimise it nor load it before printing. */}
                  {/* eslint-disable-next-line @next/next/no-img-element */}
                  {a.ringPng ? <img className="ring" src={a.ringPng} alt={`Expected ring pattern behind ${a.id}`} /> : null}
                  <figcaption style={{ fontSize: "10pt", textAlign: "center" }}>
                    Expected pattern, {fmt(2 * (a.ringMaxRadiusMm ?? 0))} mm across (bright = light)
                  </figcaption>
                </figure>
                <figure style={{ margin: 0 }}>
                  <ProfilePlot radiusMm={a.profile.radiusMm} relativeIntensity={a.profile.relativeIntensity} shadowRadiusMm={a.profile.shadowRadiusMm} label={`Radial intensity behind ${a.id}`} />
                  <figcaption style={{ fontSize: "10pt" }}>Intensity across the screen relative to the open beam; dotted: the aperture&apos;s geometric shadow edge.</figcaption>
                </figure>
              </div>
            ) : null}
          </div>
        ))}
        {analysis?.screens.length ? <ScreenFigures screens={analysis.screens} /> : null}
        <PrintNotes title="Notes on the predictions" warnings={analysis?.warnings ?? []} />
      </section>

      {/* ── Safety and approval ─────────────────────────────────────────────────────────── */}
      <section className="page">
        <h2>Laser safety</h2>
        {eyewear ? <PrintStandard data={eyewear} safety={safety} /> : null}
        {safety ? (
          <>
            <div className="grid2" style={{ marginBottom: "3mm" }}>
              <div className="box">
                <p style={{ margin: 0 }}>{HAZARD_LABELS.hazardClass}</p>
                <p className="big" style={{ fontSize: "20pt", margin: 0 }}>
                  Class {safety.laser.hazardClass}
                </p>
                <p style={{ margin: 0, fontSize: "9.5pt" }}>{plainText(safety.laser.figures.hazardClass.source)}</p>
              </div>
              <div className="box">
                <p style={{ margin: 0 }}>{HAZARD_LABELS.eyewear}</p>
                <p className="big" style={{ fontSize: "16pt", margin: 0 }} data-testid="sheet-eyewear">
                  {eyewearText.wear}
                </p>
                <p style={{ margin: 0 }}>{capitalise(eyewearText.need)}</p>
                <p style={{ margin: 0, fontSize: "9.5pt" }}>{governing ? `Highest ${governing.where === "element" ? "at" : "at the focus after"} ${governing.elementId}, ${fmt(governing.positionMm)} mm. ${plainText(governing.source)}` : "No light reaches anything."}</p>
              </div>
            </div>
            {eyewear ? <PrintCoverage data={eyewear} asOf={new Date().toISOString().slice(0, 10)} /> : null}
            <table style={{ marginBottom: "3mm" }}>
              <tbody>
                <tr>
                  <th>{HAZARD_LABELS.mpe} ({fmt(safety.laser.exposureS)} s)</th>
                  <td className="num">
                    {fmt(safety.mpe.value)} {safety.mpe.unit}
                  </td>
                  <td style={{ fontSize: "9.5pt" }}>{plainText(safety.mpe.source)}</td>
                </tr>
                <tr>
                  <th>{HAZARD_LABELS.nohd}</th>
                  <td className="num">{nohdWords(safety.laser.nohdM, (v) => fmt(v))}</td>
                  <td style={{ fontSize: "9.5pt" }}>{plainText(safety.laser.figures.nohd.source)}</td>
                </tr>
                {safety.laser.labelCheck ? (
                  <tr>
                    <th>Label class</th>
                    <td>Class {safety.laser.labelCheck.labelClass}</td>
                    <td>{safety.laser.labelCheck.matches ? "matches the estimate" : plainText(safety.laser.labelCheck.warning ?? "")}</td>
                  </tr>
                ) : null}
              </tbody>
            </table>
            {laser ? (
              <PrintPulseRegime
                rows={regimeRows(
                  safety.laserId,
                  laser,
                  safety.lines.lines.map((l) => ({ wavelengthNm: l.wavelengthNm, main: l.main, powerMw: l.powerMw, rule: l.assessment.pulsedMpe?.governingRule ?? null })),
                )}
                source={safety.laser.pulsedMpe?.source ?? null}
              />
            ) : null}
            <PrintCautions cautions={cautions} warnings={safety.warnings} />
          </>
        ) : (
          <NotComputed problem={sheet.problem} />
        )}
        <PrintScope />
      </section>

      <ApprovalBox sheet={sheet} />
    </div>
  );
}

// ── The safety page's closing parts, the same on a rail's sheet and a table's ───────────────────

/** The controls and cautions to follow, then the engines' warnings, in plain words. */
export function PrintCautions({ cautions, warnings }: { cautions: ReturnType<typeof displayedCautions>; warnings: readonly { message: string }[] }) {
  return (
    <>
      <h3>Controls and cautions</h3>
      <ul className="cautions">
        {cautions.map((c) => (
          <li key={c.id}>
            <strong>{c.title}.</strong> {c.text} <span style={{ fontSize: "9.5pt" }}>({c.reference})</span>
          </li>
        ))}
      </ul>
      {warnings.length ? (
        <ul>
          {warnings.map((w, i) => (
            <li key={i}>{plainText(w.message)}</li>
          ))}
        </ul>
      ) : null}
    </>
  );
}

/** In place of the figures when the engines could not compute them. */
export function NotComputed({ problem }: { problem: string | null | undefined }) {
  return <p className="warn">The hazard figures cannot be computed for this drawing: {problem}. Ask the laser safety officer before switching on.</p>;
}

/** What the hazard figures do not cover, that their values are not yet checked against the standard's text, and who decides. */
export function PrintScope() {
  return (
    <>
      <h3>What these hazard figures do not cover</h3>
      <ul className="scope">
        <li>{ONE_OVER_E_NOTE}</li>
        {LIMITATIONS.map((l) => (
          <li key={l.id}>{limitationText(l)}</li>
        ))}
        <li>Not yet checked against the standard&apos;s text — confirm with your laser safety officer.</li>
      </ul>
      <p className="warn">{FINAL_SAY}</p>
    </>
  );
}

/** The engines' warnings beside the predictions, in plain words, boxed; nothing when there are none. */
export function PrintNotes({ title, warnings }: { title: string; warnings: readonly { message: string }[] }) {
  if (warnings.length === 0) return null;
  return (
    <div className="box">
      <h3 style={{ marginTop: 0 }}>{title}</h3>
      <ul>
        {warnings.map((w, i) => (
          <li key={i}>{plainText(w.message)}</li>
        ))}
      </ul>
    </div>
  );
}
