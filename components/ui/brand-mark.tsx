/** Benchwarden's mark: a beam narrowing through a slit between two posts, drawn in our own shapes. */
export function BrandMark({ size = 28 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true">
      <rect x="1" y="26" width="30" height="3" rx="1" fill="currentColor" opacity="0.5" />
      <rect x="14" y="5" width="4" height="8" rx="1" fill="currentColor" />
      <rect x="14" y="19" width="4" height="6" rx="1" fill="currentColor" />
      <path d="M2 11 L14 15 L14 17 L2 21 Z" fill="currentColor" opacity="0.35" />
      <path d="M18 15.2 L30 13 L30 19 L18 16.8 Z" fill="currentColor" opacity="0.8" />
    </svg>
  );
}
