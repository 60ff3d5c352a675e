import Link from "next/link";

/** What the landing page promises; `coming` marks what no screen offers yet. */
const FEATURES: { title: string; body: string; coming?: true }[] = [
  {
    title: "Every string as a branching graph",
    body: "Each hit, follow-up and stance cancel of a character drawn as one graph in the Explorer. Click a node and the path to it is chosen.",
  },
  {
    title: "The outcome of every path",
    body: "Frame advantage on block, on hit and on counter hit; what it costs if blocked and who punishes it; where the defender must guard high, mid or low and where they must guess.",
  },
  {
    title: "Stance cancels, counted",
    body: "How many frames a cancel saves, whether it turns a punishable ending safe or a minus one plus, and which levels it guards on the way.",
  },
  {
    title: "Mix-up boards for coaches",
    body: "Build the situations after a string, let the solver find the mix that cannot be exploited, and hand it to your players.",
  },
  {
    title: "Your own game's data",
    body: "Enter or import a character's frame data, publish each patch as an Edition, and read what it changed for every string.",
  },
  {
    title: "Permalinks pinned to an Edition",
    body: "Share any view with the team; the link keeps the numbers of the Edition it was made on, even after a patch.",
  },
];

export default function LandingPage() {
  return (
    <div className="space-y-10">
      <section className="max-w-3xl space-y-4 pt-6">
        <h1 className="text-3xl font-semibold tracking-tight sm:text-4xl">Know what every string leaves you with.</h1>
        <p className="text-lg text-ink-300">
          Framefork is where competitive fighting-game players and coaches study strings and stance cancels: which
          ending keeps your turn, what a blocked string costs, where the opponent has to guess, and what is guaranteed
          after a counter hit.
        </p>
        <div className="flex flex-wrap gap-3 pt-2">
          <Link
            href="/games"
            className="rounded-md bg-accent px-4 py-2 font-medium text-ink-950 no-underline hover:bg-accent-strong"
          >
            Browse games
          </Link>
          <Link
            href="/help"
            className="rounded-md border border-ink-700 px-4 py-2 text-ink-200 no-underline hover:border-ink-400"
          >
            How to read the numbers
          </Link>
        </div>
      </section>
      <section aria-labelledby="what" className="space-y-4">
        <h2 id="what" className="text-sm font-semibold tracking-wider text-ink-400 uppercase">
          What it does
        </h2>
        <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {FEATURES.map((f) => (
            <li key={f.title} className="rounded-lg border border-ink-800 bg-ink-900 p-4">
              <h3 className="font-medium text-ink-100">
                {f.title}
                {f.coming && (
                  <span className="ml-2 rounded border border-ink-700 px-1.5 py-0.5 text-[11px] font-normal text-ink-400">
                    coming
                  </span>
                )}
              </h3>
              <p className="mt-1 text-sm text-ink-300">{f.body}</p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
