import { forwardRef, type ButtonHTMLAttributes } from "react";
import { cn } from "@/utils/cn";

type Variant = "primary" | "secondary" | "danger" | "ghost";
const variants: Record<Variant, string> = {
  primary: "bg-ink text-chalk hover:bg-ink-700 disabled:bg-ink/50",
  secondary: "bg-white text-ink border border-ink-100 hover:bg-ink-50 disabled:opacity-50",
  danger: "bg-madder text-white hover:bg-madder/90 disabled:opacity-50",
  ghost: "text-ink hover:bg-ink-50 disabled:opacity-50",
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  size?: "sm" | "md" | "lg";
  busy?: boolean;
}

/** Our button. `lg` gives the large touch target used on set. */
export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  { variant = "primary", size = "md", busy, className, children, disabled, type = "button", ...rest },
  ref,
) {
  const sizes = { sm: "px-2.5 py-1 text-sm", md: "px-3.5 py-2 text-sm", lg: "px-5 py-3 text-base min-h-12" };
  return (
    <button
      ref={ref}
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={cn(
        "inline-flex items-center justify-center gap-2 rounded-md font-semibold transition-colors",
        variants[variant],
        sizes[size],
        className,
      )}
      {...rest}
    >
      {busy && <span className="size-3.5 animate-spin rounded-full border-2 border-current border-t-transparent" aria-hidden />}
      {children}
    </button>
  );
});
