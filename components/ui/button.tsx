import type { ButtonHTMLAttributes } from "react";

type Variant = "primary" | "secondary" | "danger" | "ghost";

const styles: Record<Variant, string> = {
  primary: "bg-ink text-paper hover:bg-ink-soft disabled:bg-ink-muted aria-disabled:bg-ink-muted",
  secondary: "border border-ink-line bg-white text-ink hover:bg-paper-deep",
  danger: "border border-flag-600 bg-white text-flag-700 hover:bg-flag-50",
  ghost: "text-ink-soft hover:bg-paper-deep",
};

export function buttonClass(variant: Variant = "primary", extra = ""): string {
  return `inline-flex items-center justify-center gap-2 whitespace-nowrap rounded-md px-3.5 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed aria-disabled:cursor-not-allowed aria-disabled:opacity-60 ${styles[variant]} ${extra}`;
}

/**
 * `focusableWhenDisabled`: a disabled button that keeps its place in the Tab order (aria-disabled,
 * clicks ignored), for rows of controls where a vanishing stop would shift where Tab lands.
 */
export function Button({
  variant = "primary",
  className = "",
  focusableWhenDisabled = false,
  disabled,
  onClick,
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; focusableWhenDisabled?: boolean }) {
  if (focusableWhenDisabled) {
    return (
      <button
        className={buttonClass(variant, className)}
        aria-disabled={disabled ? true : undefined}
        onClick={(e) => {
          if (disabled) {
            e.preventDefault();
            return;
          }
          onClick?.(e);
        }}
        {...props}
      />
    );
  }
  return <button className={buttonClass(variant, className)} disabled={disabled} onClick={onClick} {...props} />;
}
