import type { ButtonHTMLAttributes } from "react";

type Variant = "primary" | "quiet" | "danger";

const styles: Record<Variant, string> = {
  primary: "bg-accent text-ink hover:bg-accent-strong font-semibold",
  quiet: "border border-line text-text hover:bg-raised",
  danger: "border border-danger text-danger hover:bg-danger hover:text-ink",
};

export function Button({ variant = "primary", className = "", ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      className={`inline-flex min-h-11 items-center justify-center gap-2 rounded-md px-4 py-2 text-base transition disabled:cursor-not-allowed disabled:opacity-50 ${styles[variant]} ${className}`}
      {...props}
    />
  );
}
