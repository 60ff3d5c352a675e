import { useId, type ReactNode } from "react";

/**
 * A figure that explains itself: the explanation shows on hover and on
 * keyboard focus, and is the figure's accessible description. Hidden, it is
 * not laid out at all (display: none, which aria-describedby still reads), so
 * a card full of figures costs no text layout for explanations nobody opened.
 * Its classes are in globals.css: a sheet shows dozens of these.
 */
export function Explained({ children, explain, field }: { children: ReactNode; explain: string; field?: string }) {
  const id = useId();
  return (
    <span className="explained group" tabIndex={0} aria-describedby={id}>
      <span data-field={field}>{children}</span>
      <span id={id} role="tooltip" className="explanation">
        {explain}
      </span>
    </span>
  );
}
