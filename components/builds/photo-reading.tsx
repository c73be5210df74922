"use client";
// The screen photos behind one aperture: each photo, "Read the pattern" while it has not been read, and the reading
// beside the prediction — the fitted zone count, centre, screen distance against the drawn one, scale, dark-ring radii,
// confidence, the photo with the centre and rings marked, and its profile over the predicted one. A photo that could
// not be read shows the sentence saying why.
import { useState } from "react";
import { Button } from "@/components/ui/button";
import type { BuildView, PhotoReadingView } from "@/lib/api/contracts/builds";
import { capitalise, CENTRE_MARKS, CENTRE_WORDS, formatDateTime, formatFixed, formatNumber } from "@/lib/format";
import { usePhotoReading } from "./build-queries";
import { PhotoProfilePlot } from "./photo-profile-plot";

const mm = (v: number) => `${formatFixed(v, Math.abs(v) >= 100 ? 0 : Math.abs(v) >= 10 ? 1 : 2)} mm`;
const centre = (c: keyof typeof CENTRE_WORDS) => `${CENTRE_MARKS[c]} ${capitalise(CENTRE_WORDS[c])}`;

/** The photo with the fitted centre (cross), the dark rings (dashed) and the shadow's edge (dotted) drawn over it. */
function MarkedPhoto({ reading }: { reading: PhotoReadingView }) {
  const r = reading.result!;
  const { x, y } = r.centrePx;
  const edgePx = r.shadowRadiusMm / r.mmPerPixel;
  const stroke = Math.max(1.5, r.imageWidthPx / 400);
  return (
    <svg viewBox={`0 0 ${r.imageWidthPx} ${r.imageHeightPx}`} className="w-full rounded border border-line bg-black" role="img" aria-label={`${reading.fileName} with the centre and ${r.ringRadiiPx.length} dark rings found marked`}>
      <image href={reading.photoUrl} x={0} y={0} width={r.imageWidthPx} height={r.imageHeightPx} preserveAspectRatio="none" />
      {r.ringRadiiPx.map((rr) => (
        <circle key={rr} cx={x} cy={y} r={rr} fill="none" stroke="#7cc4ff" strokeWidth={stroke} strokeDasharray={`${4 * stroke} ${3 * stroke}`} opacity={0.8} />
      ))}
      <circle cx={x} cy={y} r={edgePx} fill="none" stroke="#f2b134" strokeWidth={stroke} strokeDasharray={`${stroke} ${3 * stroke}`} />
      <path d={`M ${x - 12 * stroke} ${y} H ${x + 12 * stroke} M ${x} ${y - 12 * stroke} V ${y + 12 * stroke}`} stroke="#f2b134" strokeWidth={stroke} />
    </svg>
  );
}

export function PhotoReadingCard({ reading }: { reading: PhotoReadingView }) {
  if (reading.refusal || !reading.result) {
    return (
      <div className="rounded-md border border-warn px-3 py-2" data-testid="photo-reading" role="status">
        <p className="font-medium text-warn">▲ The pattern could not be read from {reading.fileName}</p>
        <p className="text-sm">{reading.refusal}</p>
        <p className="text-xs text-muted">
          Tried by {reading.readByName}, {formatDateTime(reading.createdAt)}. Nothing was recorded as seen.
        </p>
      </div>
    );
  }
  const r = reading.result;
  const delta = r.screenDistanceMm - r.drawnDistanceMm;
  return (
    <div className={`flex flex-col gap-3 rounded-md border px-3 py-3 ${reading.mismatch ? "border-danger" : "border-line"}`} data-testid="photo-reading">
      <p className="font-medium">
        {reading.mismatch ? <span className="text-danger">✕ Mismatch</span> : <span className="text-ok">✓ Matches</span>}
        <span className="text-sm text-muted">
          {" "}
          · read from {reading.fileName}
          {r.pathId && r.screenId ? ` (the screen ${r.screenId}, beam ${r.pathId})` : ""} by {reading.readByName}, {formatDateTime(reading.createdAt)}
        </span>
      </p>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-muted">Half-period zones</dt>
        <dd className="font-mono">
          {formatNumber(r.zoneCount)} fitted <span className="text-muted">(predicted {formatNumber(r.predictedZoneCount)})</span>
        </dd>
        <dt className="text-muted">Centre</dt>
        <dd>
          {centre(r.centre)} <span className="text-muted">(predicted: {CENTRE_WORDS[r.centrePredicted]})</span>
        </dd>
        <dt className="text-muted">Screen distance</dt>
        <dd className="font-mono" data-testid="photo-distance">
          {mm(r.screenDistanceMm)} fitted, drawn {mm(r.drawnDistanceMm)}{" "}
          <span className={Math.abs(delta) > r.distanceToleranceMm ? "text-danger" : "text-muted"}>
            ({Math.abs(delta) < 0.05 ? "the same" : `${mm(Math.abs(delta))} ${delta > 0 ? "further" : "nearer"}`}; allowed ±{mm(r.distanceToleranceMm)})
          </span>
        </dd>
        <dt className="text-muted">Scale</dt>
        <dd className="font-mono">
          {formatNumber(1 / r.mmPerPixel)} pixels per mm on the screen
        </dd>
        <dt className="text-muted">Dark rings at</dt>
        <dd className="font-mono">{r.ringRadiiMm.length ? `${r.ringRadiiMm.map((v) => formatFixed(v, 2)).join(", ")} mm from the centre` : "none found"}</dd>
        <dt className="text-muted">Confidence</dt>
        <dd className="font-mono">
          {formatFixed(r.quality * 100, 0)} %{r.quality < 0.6 ? <span className="text-warn"> — a weak match: take a sharper photo square-on to the screen</span> : null}
        </dd>
      </dl>
      {reading.reasons.length ? (
        <ul className="text-sm font-medium text-danger">
          {reading.reasons.map((reason) => (
            <li key={reason}>{reason}</li>
          ))}
        </ul>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <figure className="flex flex-col gap-1">
          <MarkedPhoto reading={reading} />
          <figcaption className="text-xs text-muted">
            The photo ({r.imageWidthPx} × {r.imageHeightPx} px{r.orientation !== 1 ? ", turned as its camera recorded" : ""}): + the centre found, dashed the dark rings, dotted the shadow&apos;s edge.
          </figcaption>
        </figure>
        <figure className="flex flex-col gap-1">
          <PhotoProfilePlot radiusMm={r.profile.radiusMm} measured={r.profile.measured} fitted={r.profile.fitted} predicted={r.profile.predicted} label={`The photo's radial profile behind ${reading.apertureId} over the predicted one`} />
          <figcaption className="text-xs text-muted">Intensity relative to the open beam (the photo&apos;s levels through the fitted tone curve). Flat tops are pixels the camera saturated; the fit leaves them out.</figcaption>
        </figure>
      </div>
      <p className="text-xs text-muted">
        A distance further than allowed, or a centre of the other brightness, is flagged and e-mailed to the bench&apos;s author like a typed observation. The distance comes from the zone count with the rest of the bench as drawn.
      </p>
    </div>
  );
}

/** Every screen photo of the build, each with its reading behind this aperture or the button to read it. */
export function ScreenPhotos({ build, apertureId, screenIds = [] }: { build: BuildView; apertureId: string; screenIds?: string[] }) {
  const read = usePhotoReading(build.id);
  const [screenId, setScreenId] = useState(screenIds[0] ?? "");
  const photos = build.uploads.filter((u) => u.kind === "screen-photo");
  if (!photos.length) return null;
  return (
    <div className="flex flex-col gap-3">
      {screenIds.length > 1 ? (
        <label className="flex flex-wrap items-center gap-2 text-sm">
          <span>The light through {apertureId} reaches {screenIds.length} screens; the photo to read shows</span>
          <select className="min-h-11 rounded-md border border-line bg-ink px-2 text-text" value={screenId} onChange={(e) => setScreenId(e.target.value)}>
            {screenIds.map((id) => (
              <option key={id} value={id}>
                {id}
              </option>
            ))}
          </select>
        </label>
      ) : null}
      <ul className="flex flex-col gap-3">
        {photos.map((u) => {
          const reading = build.photoReadings.find((p) => p.uploadId === u.id && p.apertureId === apertureId);
          const pending = read.isPending && read.variables?.uploadId === u.id;
          const failed = read.error && read.variables?.uploadId === u.id ? read.error : null;
          return (
            <li key={u.id} className="flex flex-col gap-2" data-testid="screen-photo">
              {reading?.result ? null : (
                <div className="flex flex-wrap items-start gap-3 rounded-md border border-line p-2">
                  {u.contentType.startsWith("image/") ? (
                    // eslint-disable-next-line @next/next/no-img-element
                    <img src={u.url} alt={`${u.fileName}, uploaded by ${u.uploadedByName}`} className="max-h-40 max-w-56 rounded object-contain" />
                  ) : (
                    <a href={u.url}>📄 {u.fileName}</a>
                  )}
                  <div className="flex flex-col gap-2">
                    <p className="break-all text-xs text-muted">
                      {u.fileName} · {Math.max(1, Math.round(u.sizeBytes / 1024))} kB · SHA-256 {u.sha256.slice(0, 16)}…
                    </p>
                    {!reading && build.may.record && u.contentType.startsWith("image/") ? (
                      <div>
                        <Button
                          type="button"
                          variant="quiet"
                          disabled={read.isPending}
                          onClick={() => read.mutate(screenIds.length ? { uploadId: u.id, apertureId, screenId } : { uploadId: u.id, apertureId })}
                          aria-label={`Read the pattern in ${u.fileName} behind ${apertureId}${screenIds.length > 1 ? ` on ${screenId}` : ""}`}
                        >
                          {pending ? "Reading the pattern…" : "Read the pattern"}
                        </Button>
                      </div>
                    ) : null}
                    {failed ? (
                      <p role="alert" className="text-sm text-danger">
                        {failed.message}
                      </p>
                    ) : null}
                  </div>
                </div>
              )}
              {reading ? <PhotoReadingCard reading={reading} /> : null}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
