"use client";
// The build page's working area: the checklist, then each aperture's prediction beside what was seen
// (observations and photos), other uploads, and the technician completing the build.
import { useQuery } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { ProfilePlot } from "@/components/sheets/profile-plot";
import type { BuildView, ObservationView } from "@/lib/api/contracts/builds";
import { BUILD_DONE, capitalise, CENTRE_MARKS, centreWords, formatDateTime, formatNumber, type CentreState } from "@/lib/format";
import { buildQuery, useSignOff } from "./build-queries";
import type { CoverageData } from "@/components/eyewear/coverage-list";
import { Checklist } from "./checklist";
import { ObservationForm } from "./observation-form";
import { UploadForm } from "./upload-form";
import { ScreenPhotos } from "./photo-reading";

export type PredictionImages = Record<string, { ringPng: string | null; profile: { radiusMm: number[]; relativeIntensity: number[]; shadowRadiusMm: number } | null; acrossMm: number | null }>;

const fmt = (v: number | null | undefined) => formatNumber(v);
const centreLabel = (c: string | null | undefined) => {
  if (!c) return "—";
  const state = c === "unclear" ? "between" : (c as CentreState);
  return `${CENTRE_MARKS[state] ?? ""} ${capitalise(centreWords(state))}`;
};

function ObservationItem({ o }: { o: ObservationView }) {
  return (
    <li className={`rounded-md border px-3 py-2 ${o.mismatch ? "border-danger" : "border-line"}`} data-testid="observation">
      <p className="font-medium">
        {o.mismatch ? <span className="text-danger">✕ Mismatch</span> : <span className="text-ok">✓ Matches</span>}
        <span className="text-sm text-muted"> · {o.recordedByName}, {formatDateTime(o.createdAt)}</span>
      </p>
      <ul className="text-sm">
        {o.centreSeen ? <li>Centre seen: {centreLabel(o.centreSeen)} (predicted: {centreLabel(o.centrePredicted)})</li> : null}
        {o.spotDiameterMm !== null ? <li>Diameter: {o.spotDiameterMm} mm (predicted {fmt(o.predictedSpotDiameterMm)} mm)</li> : null}
        {o.screenPowerMw !== null ? <li>Power at the screen: {o.screenPowerMw} mW (predicted {fmt(o.predictedScreenPowerMw)} mW)</li> : null}
      </ul>
      {o.reasons.length ? (
        <ul className="mt-1 text-sm font-medium text-danger">
          {o.reasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
      ) : null}
      {o.note ? <p className="mt-1 text-sm text-muted">“{o.note}”</p> : null}
    </li>
  );
}

function Uploads({ uploads }: { uploads: BuildView["uploads"] }) {
  if (!uploads.length) return null;
  return (
    <ul className="grid gap-3 sm:grid-cols-2">
      {uploads.map((u) => (
        <li key={u.id} className="rounded-md border border-line p-2" data-testid="upload">
          {u.contentType.startsWith("image/") ? (
            // eslint-disable-next-line @next/next/no-img-element
            <img src={u.url} alt={`${u.fileName}, uploaded by ${u.uploadedByName}`} className="max-h-56 w-full rounded object-contain" />
          ) : (
            <a href={u.url}>📄 {u.fileName}</a>
          )}
          <p className="mt-1 break-all text-xs text-muted">
            {u.fileName} · {Math.max(1, Math.round(u.sizeBytes / 1024))} kB · SHA-256 {u.sha256.slice(0, 16)}…
          </p>
        </li>
      ))}
    </ul>
  );
}

export function BuildWorkspace({ buildId, images, eyewear = null }: { buildId: string; images: PredictionImages; eyewear?: CoverageData | null }) {
  const { data: build } = useQuery(buildQuery(buildId));
  const signOff = useSignOff(buildId);
  if (!build) return <p className="text-muted">Loading the build record…</p>;
  const { predictions } = build;
  const screenUploads = build.uploads.filter((u) => u.kind === "screen-photo");
  const otherUploads = build.uploads.filter((u) => u.kind !== "screen-photo");
  return (
    <div className="flex flex-col gap-10">
      <section aria-labelledby="checklist-heading" className="flex flex-col gap-3">
        <h2 id="checklist-heading" className="text-xl font-semibold">As-built checklist</h2>
        <Checklist build={build} eyewear={eyewear} />
      </section>

      <section aria-labelledby="seen-heading" className="flex flex-col gap-4">
        <h2 id="seen-heading" className="text-xl font-semibold">What you saw, beside the prediction</h2>
        <p className="text-muted">
          A diameter more than {build.tolerance.spotPercent} % or a power more than {build.tolerance.powerPercent} % away from the prediction, or a centre of the other brightness, is flagged as a mismatch and e-mailed to the bench&apos;s author. Upload a photo of the screen and read its pattern: the zone count, centre and screen distance fitted to it are judged the same way.
        </p>
        {predictions.problem ? <p role="alert" className="rounded-md border border-warn p-3">The predictions cannot be computed: {predictions.problem}</p> : null}
        {predictions.apertures.map((a) => {
          const img = images[a.apertureId];
          return (
            <article key={a.apertureId} className="grid gap-4 rounded-xl border border-line bg-panel p-4 lg:grid-cols-2" data-testid={`aperture-${a.apertureId}`}>
              <div className="flex min-w-0 flex-col gap-3">
                <h3 className="text-lg font-semibold">
                  Predicted behind {a.apertureId} <span className="text-muted">(⌀ {a.diameterMm} mm{a.screenId ? `, on ${a.screenId}` : ""})</span>
                </h3>
                {a.screenIds && a.screenIds.length > 1 ? (
                  <p className="text-sm text-muted" data-testid={`other-screens-${a.apertureId}`}>
                    These figures are for {a.screenId}; the light through {a.apertureId} also reaches {a.screenIds.filter((id) => id !== a.screenId).join(" and ")}. A photo of that screen is read against its own beam: choose the screen beside the photos.
                  </p>
                ) : null}
                <p className="text-2xl font-semibold">{centreLabel(a.centre)}</p>
                <dl className="grid grid-cols-2 gap-2 text-sm">
                  <dt className="text-muted">Half-period zones</dt>
                  <dd className="font-mono">{fmt(a.fresnelNumber)}</dd>
                  <dt className="text-muted">Centre intensity</dt>
                  <dd className="font-mono">×{fmt(a.centreIntensityRatio)} of the open beam</dd>
                  <dt className="text-muted">Pattern diameter</dt>
                  <dd className="font-mono">{fmt(a.spotDiameterMm)} mm</dd>
                  <dt className="text-muted">Power at the screen</dt>
                  <dd className="font-mono">{fmt(a.screenPowerMw)} mW</dd>
                </dl>
                <div className="flex flex-wrap items-start gap-3">
                  {img?.ringPng ? (
                    <figure className="flex flex-col items-center gap-1">
                      {/* eslint-disable-next-line @next/next/no-img-element */}
                      <img src={img.ringPng} alt={`Expected ring pattern behind ${a.apertureId}`} className="h-44 w-44 rounded-full border border-line" />
                      <figcaption className="text-xs text-muted">Expected, {fmt(img.acrossMm)} mm across</figcaption>
                    </figure>
                  ) : null}
                  {img?.profile ? (
                    <div className="min-w-56 flex-1">
                      <ProfilePlot radiusMm={img.profile.radiusMm} relativeIntensity={img.profile.relativeIntensity} shadowRadiusMm={img.profile.shadowRadiusMm} label={`Radial intensity behind ${a.apertureId}`} dark />
                    </div>
                  ) : null}
                </div>
              </div>
              <div className="flex min-w-0 flex-col gap-3">
                <h3 className="text-lg font-semibold">Seen</h3>
                <ul className="flex flex-col gap-2">
                  {build.observations
                    .filter((o) => o.apertureId === a.apertureId)
                    .map((o) => (
                      <ObservationItem key={o.id} o={o} />
                    ))}
                </ul>
                {build.may.record ? (
                  <>
                    <ObservationForm buildId={build.id} apertureId={a.apertureId} label={`behind ${a.apertureId}`} />
                    <UploadForm buildId={build.id} id={a.apertureId} />
                  </>
                ) : null}
              </div>
              {screenUploads.length ? (
                <div className="flex min-w-0 flex-col gap-2 lg:col-span-2">
                  <h3 className="text-lg font-semibold">Photos of the screen behind {a.apertureId}</h3>
                  <ScreenPhotos build={build} apertureId={a.apertureId} screenIds={a.screenIds} />
                </div>
              ) : null}
            </article>
          );
        })}
        {predictions.screen && !predictions.apertures.length ? (
          <article className="grid gap-4 rounded-xl border border-line bg-panel p-4 lg:grid-cols-2" data-testid="screen-prediction">
            <div>
              <h3 className="text-lg font-semibold">Predicted on {predictions.screen.screenId}</h3>
              <p>Beam diameter {fmt(predictions.screen.beamDiameterMm)} mm (1/e²), power {fmt(predictions.screen.powerMw)} mW.</p>
            </div>
            <div className="flex min-w-0 flex-col gap-3">
              <Uploads uploads={screenUploads} />
              <ul className="flex flex-col gap-2">
                {build.observations.filter((o) => o.apertureId === null).map((o) => <ObservationItem key={o.id} o={o} />)}
              </ul>
              {build.may.record ? <ObservationForm buildId={build.id} apertureId={null} label="on the screen" /> : null}
              {build.may.record ? <UploadForm buildId={build.id} id="screen" /> : null}
            </div>
          </article>
        ) : null}
      </section>

      <section aria-labelledby="files-heading" className="flex flex-col gap-3">
        <h2 id="files-heading" className="text-xl font-semibold">Bench photos and datasheets</h2>
        <Uploads uploads={otherUploads} />
        {!otherUploads.length ? <p className="text-muted">None yet.</p> : null}
        {build.may.record ? <UploadForm buildId={build.id} defaultKind="bench-photo" id="bench" /> : null}
      </section>

      <section aria-labelledby="signoff-heading" className="flex flex-col gap-3 rounded-xl border border-line bg-panel p-4">
        <h2 id="signoff-heading" className="text-xl font-semibold">{BUILD_DONE.verb}</h2>
        {build.state === "completed" ? (
          <p className="text-lg text-ok">● {BUILD_DONE.done} by {build.technicianName}, {formatDateTime(build.signedOffAt)}.</p>
        ) : (
          <>
            <p className="text-muted">Completing the build records that the bench was built as drawn, every control and condition is in place and the eyewear is available.</p>
            {build.may.whyNotSignOff ? <p className="text-warn">▲ {build.may.whyNotSignOff}</p> : null}
            <div>
              <Button type="button" disabled={!build.may.signOff || signOff.isPending} onClick={() => signOff.mutate()}>
                {BUILD_DONE.verb}
              </Button>
            </div>
            {signOff.error ? <p role="alert" className="text-danger">{signOff.error.message}</p> : null}
          </>
        )}
      </section>
    </div>
  );
}
