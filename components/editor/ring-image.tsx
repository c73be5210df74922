"use client";
// The ring pattern on the screen, painted from the radial profile: brightness ∝ (I / I_max)^γ, tinted by the
// laser's wavelength (the tint is decoration; the rings' positions and the centre word carry the meaning).
import { useEffect, useRef } from "react";

const SIZE_PX = 220;
const GAMMA = 0.6;
/** Radius (pixels) of the disc painted with the value at r = 0. */
const CENTRE_DISC_PX = 2.5;

/** An approximate sRGB tint for a visible wavelength; white outside 380–750 nm. */
export function wavelengthTint(nm: number | null): [number, number, number] {
  if (nm === null || nm < 380 || nm > 750) return [235, 240, 238];
  let r = 0, g = 0, b = 0;
  if (nm < 440) [r, g, b] = [(440 - nm) / 60, 0, 1];
  else if (nm < 490) [r, g, b] = [0, (nm - 440) / 50, 1];
  else if (nm < 510) [r, g, b] = [0, 1, (510 - nm) / 20];
  else if (nm < 580) [r, g, b] = [(nm - 510) / 70, 1, 0];
  else if (nm < 645) [r, g, b] = [1, (645 - nm) / 65, 0];
  else [r, g, b] = [1, 0, 0];
  // lift the darkest hues so a 405 nm pattern is still readable on screen
  return [r, g, b].map((c) => Math.round(60 + 195 * c)) as [number, number, number];
}

export function RingImage({ radiusMm, intensity, wavelengthNm, label }: { radiusMm: number[]; intensity: number[]; wavelengthNm: number | null; label: string }) {
  const ref = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const canvas = ref.current;
    const ctx = canvas?.getContext("2d");
    if (!canvas || !ctx || radiusMm.length < 2) return;
    const maxR = radiusMm[radiusMm.length - 1];
    const maxI = Math.max(...intensity, 1e-12);
    const [tr, tg, tb] = wavelengthTint(wavelengthNm);
    const image = ctx.createImageData(SIZE_PX, SIZE_PX);
    const half = SIZE_PX / 2;
    const step = maxR / (radiusMm.length - 1);
    for (let y = 0; y < SIZE_PX; y++) {
      for (let x = 0; x < SIZE_PX; x++) {
        const d = Math.hypot(x + 0.5 - half, y + 0.5 - half) / half;
        const r = d * maxR;
        let v = 0;
        // within a few pixels of the axis, the on-axis value: a central spot smaller than a pixel still shows true
        if (Math.hypot(x + 0.5 - half, y + 0.5 - half) <= CENTRE_DISC_PX) v = intensity[0];
        else if (r <= maxR) {
          const f = r / step;
          const i = Math.min(radiusMm.length - 2, Math.floor(f));
          const t = f - i;
          v = intensity[i] * (1 - t) + intensity[i + 1] * t;
        }
        const level = Math.pow(Math.max(0, v) / maxI, GAMMA);
        const o = (y * SIZE_PX + x) * 4;
        image.data[o] = tr * level;
        image.data[o + 1] = tg * level;
        image.data[o + 2] = tb * level;
        image.data[o + 3] = 255;
      }
    }
    ctx.putImageData(image, 0, 0);
  }, [radiusMm, intensity, wavelengthNm]);
  return (
    <figure className="flex flex-col items-center gap-1">
      <canvas ref={ref} width={SIZE_PX} height={SIZE_PX} className="rounded-full border border-line" role="img" aria-label={label} data-testid="ring-image" />
      <figcaption className="text-xs text-muted">Screen, {radiusMm.length ? `${Number((2 * radiusMm[radiusMm.length - 1]).toPrecision(3))} mm across` : ""}</figcaption>
    </figure>
  );
}
