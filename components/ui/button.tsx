import clsx from "clsx";
import type { ButtonHTMLAttributes } from "react";

type Variant = "primary" | "secondary" | "quiet" | "danger";

const VARIANTS: Record<Variant, string> = {
  primary: "bg-copper text-paper hover:bg-copper-deep border-copper",
  secondary: "bg-paper text-ink border-rule hover:border-copper hover:text-copper-deep",
  quiet: "bg-transparent text-copper-deep border-transparent hover:underline",
  danger: "bg-paper text-deviates border-deviates hover:bg-deviates hover:text-paper",
};

export function Button({
  variant = "primary",
  className,
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      {...props}
      className={clsx(
        "inline-flex items-center justify-center gap-2 rounded border px-3 py-1.5 text-sm font-medium",
        "disabled:cursor-not-allowed disabled:opacity-60",
        VARIANTS[variant],
        className,
      )}
    />
  );
}
