import { forbidden } from "next/navigation";

/** A page the caller's roles do not open answers 403 with app/forbidden.tsx; the reason is logged, not shown twice. */
export function Refused({ reason }: { reason: string }): never {
  void reason;
  forbidden();
}
