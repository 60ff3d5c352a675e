import { useId, type ReactNode } from "react";

/**
 * A figure that explains itself: the explanation shows on hover and on
 * keyboard focus, and is the figure's accessible description.
 */
export function Explained({ children, explain, field }: { children: ReactNode; explain: string; field?: string }) {
  const id = useId();
  return (
    <span className="group relative inline-flex items-center" tabIndex={0} aria-describedby={id}>
      <span data-field={field}>{children}</span>
      <span
        id={id}
        role="tooltip"
        className="pointer-events-none invisible absolute bottom-full left-0 z-20 mb-1 w-64 rounded border border-ink-700 bg-ink-850 px-2 py-1 text-xs font-normal normal-case tracking-normal text-ink-200 opacity-0 shadow-lg transition-opacity group-hover:visible group-hover:opacity-100 group-focus:visible group-focus:opacity-100"
      >
        {explain}
      </span>
    </span>
  );
}
