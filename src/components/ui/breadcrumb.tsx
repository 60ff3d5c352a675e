import Link from "next/link";

/** Where this page sits: each step a link, separated by slashes. */
export function Breadcrumb({ trail }: { trail: { href: string; label: string }[] }) {
  return (
    <nav aria-label="Breadcrumb" className="flex flex-wrap gap-2 text-sm text-ink-400">
      {trail.map((step, i) => (
        <span key={step.href} className="flex gap-2">
          {i > 0 && <span aria-hidden>/</span>}
          <Link href={step.href} className="hover:underline">
            {step.label}
          </Link>
        </span>
      ))}
    </nav>
  );
}
