import { useId, type ReactNode } from "react";

/**
 * A figure that explains itself: the explanation shows on hover and on
 * keyboard focus, and is the figure's accessible description. Hidden, it is
 * not laid out at all (display: none, which aria-describedby still reads), so
 * a card full of figures costs no text layout for explanations nobody opened.
 */
export function Explained({ children, explain, field }: { children: ReactNode; explain: string; field?: string }) {
  const id = useId();
  return (
    <span className="group relative inline-flex items-center" tabIndex={0} aria-describedby={id}>
      <span data-field={field}>{children}</span>
      <span
        id={id}
        role="tooltip"
        className="pointer-events-none absolute bottom-full left-0 z-20 mb-1 hidden w-64 rounded border border-ink-700 bg-ink-850 px-2 py-1 text-xs font-normal tracking-normal text-ink-200 normal-case shadow-lg group-hover:block group-focus:block"
      >
        {explain}
      </span>
    </span>
  );
}
