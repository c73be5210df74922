// The centre of the pattern as a shape and a word: filled disc = bright, ring = dark, half disc = between.
export function CentreMark({ centre }: { centre: "bright" | "dark" | "between" }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      <svg width="14" height="14" viewBox="-7 -7 14 14" aria-hidden="true">
        {centre === "bright" ? <circle r="6" fill="currentColor" /> : null}
        {centre === "dark" ? <circle r="5.2" fill="none" stroke="currentColor" strokeWidth="1.6" /> : null}
        {centre === "between" ? (
          <>
            <circle r="5.2" fill="none" stroke="currentColor" strokeWidth="1.6" />
            <path d="M0,-5.2 A5.2,5.2 0 0 0 0,5.2 Z" fill="currentColor" />
          </>
        ) : null}
      </svg>
      {centre}
    </span>
  );
}
