"use client";

export default function ErrorPage({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="max-w-xl space-y-3 py-10">
      <h1 className="text-2xl font-semibold">Something went wrong on our side</h1>
      <p className="text-ink-300">
        The page could not be loaded. If the database was restarting, trying again usually works.
      </p>
      <button
        type="button"
        onClick={reset}
        className="rounded-md bg-accent px-4 py-2 font-medium text-ink-950 hover:bg-accent-strong"
      >
        Try again
      </button>
    </div>
  );
}
