"use client";
// For the selected aperture: the radial intensity on its screen (recharts) and the ring image painted from it.
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { ApertureAnalysis } from "@/lib/optics";
import type { ProfileResponse } from "@/lib/api/bench-queries";
import { CentreMark } from "./centre-mark";
import { sig } from "./format";
import { THEME } from "./palette-colours";
import { RingImage } from "./ring-image";

type Props = { aperture: ApertureAnalysis; profile: ProfileResponse | undefined; loading: boolean; error: string | null; stale: boolean; wavelengthNm: number | null };

export function ProfilePanel({ aperture, profile, loading, error, stale, wavelengthNm }: Props) {
  if (aperture.screenId === null) return <p className="text-sm text-muted">No screen receives the light of {aperture.id}, so there is no pattern to draw.</p>;
  const data = profile ? profile.radiusMm.map((r, i) => ({ r, i: profile.relativeIntensity[i] })) : [];
  return (
    <div className={`grid gap-4 md:grid-cols-[1fr_auto] ${stale ? "opacity-50" : ""}`} aria-busy={loading}>
      <div className="min-w-0">
        <h3 className="mb-1 text-base font-semibold">
          Pattern of {aperture.id} on {aperture.screenId} — <CentreMark centre={aperture.centre} /> centre
        </h3>
        <p className="mb-2 text-xs text-muted">Intensity on the screen at radius r, relative to the on-axis intensity without the aperture (so 1 = the open beam).</p>
        {error ? <p className="text-sm text-danger">{error}</p> : null}
        <div className="h-56 w-full">
          {data.length > 0 ? (
            <ResponsiveContainer width="100%" height="100%">
              <LineChart data={data} margin={{ top: 8, right: 12, bottom: 18, left: 0 }}>
                <CartesianGrid stroke={THEME.line} strokeDasharray="3 4" />
                <XAxis dataKey="r" type="number" domain={[0, "dataMax"]} tickFormatter={(v: number) => sig(v, 2)} stroke={THEME.muted} fontSize={12} label={{ value: "radius on the screen (mm)", position: "insideBottom", offset: -10, fill: THEME.muted, fontSize: 12 }} />
                <YAxis stroke={THEME.muted} fontSize={12} tickFormatter={(v: number) => sig(v, 2)} width={44} />
                <ReferenceLine y={1} stroke={THEME.muted} strokeDasharray="4 4" />
                <Tooltip
                  contentStyle={{ background: THEME.panel, border: `1px solid ${THEME.line}`, color: THEME.text }}
                  formatter={(v) => [sig(Number(v)), "relative intensity"]}
                  labelFormatter={(v) => `r = ${sig(Number(v))} mm`}
                />
                <Line type="monotone" dataKey="i" stroke={THEME.accent} dot={false} strokeWidth={2} isAnimationActive={false} />
              </LineChart>
            </ResponsiveContainer>
          ) : (
            <p className="text-sm text-muted">{loading ? "Computing the pattern…" : ""}</p>
          )}
        </div>
      </div>
      {profile ? (
        <RingImage
          radiusMm={profile.radiusMm}
          intensity={profile.relativeIntensity}
          wavelengthNm={wavelengthNm}
          label={`Ring pattern of ${aperture.id}: ${sig(aperture.zonesExposed)} zones, ${aperture.centre} centre`}
        />
      ) : null}
    </div>
  );
}
