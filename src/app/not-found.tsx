import Link from "next/link";

export default function NotFound() {
  return (
    <div className="max-w-xl space-y-3 py-10">
      <h1 className="text-2xl font-semibold">Not here</h1>
      <p className="text-ink-300">There is no page at this address. The game or character may have been renamed.</p>
      <Link href="/games" className="text-accent underline underline-offset-2">
        Browse games
      </Link>
    </div>
  );
}
