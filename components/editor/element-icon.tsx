// The element symbols as small SVG icons for the palette and the element list: the same outlines as the drawing.
import type { ElementKind } from "@/lib/bench/schema";

export function ElementIcon({ kind, size = 28, diverging = false }: { kind: ElementKind; size?: number; diverging?: boolean }) {
  return (
    <svg width={size} height={size} viewBox="-24 -24 48 48" aria-hidden="true" className="shrink-0">
      {kind === "laser" ? (
        <g stroke="currentColor" strokeWidth="2.5" fill="none">
          <rect x="-20" y="-9" width="24" height="18" rx="2" />
          <path d="M-15,-9 V-14 H-3 V-9" />
          <path d="M8,-6 L18,0 L8,6 Z" fill="currentColor" />
        </g>
      ) : null}
      {kind === "lens" ? (
        diverging ? (
          <path d="M-7,-20 H7 Q1,0 7,20 H-7 Q-1,0 -7,-20 Z" stroke="currentColor" strokeWidth="2.5" fill="none" />
        ) : (
          <path d="M0,-21 Q12,0 0,21 Q-12,0 0,-21 Z" stroke="currentColor" strokeWidth="2.5" fill="none" />
        )
      ) : null}
      {kind === "aperture" ? (
        <g fill="currentColor">
          <rect x="-3" y="-21" width="6" height="15" />
          <rect x="-3" y="6" width="6" height="15" />
          <rect x="-8" y="-7" width="16" height="2" />
          <rect x="-8" y="5" width="16" height="2" />
        </g>
      ) : null}
      {kind === "filter" ? (
        <g stroke="currentColor" strokeWidth="2" fill="none">
          <rect x="-6" y="-18" width="12" height="36" />
          <path d="M-6,-4 L6,-14 M-6,8 L6,-2 M-6,18 L6,10" />
        </g>
      ) : null}
      {kind === "beam-block" ? (
        <g>
          <rect x="-10" y="-16" width="20" height="32" rx="2" fill="currentColor" />
          <path d="M-6,-11 L6,11 M6,-11 L-6,11" stroke="var(--color-ink)" strokeWidth="3" />
        </g>
      ) : null}
      {kind === "screen" ? (
        <g stroke="currentColor" strokeWidth="2.5" fill="none">
          <path d="M2,-22 V22" strokeWidth="4" />
          <path d="M-6,-18 V-22 H2 M-6,18 V22 H2" />
        </g>
      ) : null}
    </svg>
  );
}
