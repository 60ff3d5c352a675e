import type { Metadata } from "next";

export const metadata: Metadata = { title: "Help" };

const TERMS: [string, string][] = [
  ["Startup", "The move's first active frame. A 10-frame move hits on frame 10."],
  [
    "On block / on hit / on counter hit",
    "Frame advantage after the exchange: +3 means you act 3 frames before the opponent, -12 that they act 12 frames before you. Some outcomes are states (knockdown, launch, wall-splat, crumple, throw).",
  ],
  [
    "Punishable",
    "At -10 on block or worse (with the game's fastest attack at 10 frames), the opponent's fastest move lands before you recover.",
  ],
  [
    "Gap",
    "Frames in a blocked string in which the defender is free before the next hit. A gap of 0 or less jails: the defender must keep guarding.",
  ],
  ["Natural combo", "Every hit after the first is guaranteed once the first one connects."],
  [
    "Stance cancel",
    "Ending a move early into a stance, which changes its recovery and so its frame advantage. Some cancels guard listed hit levels automatically on the way (auto-guard).",
  ],
  ["Edition", "One version of a game's frame data, usually a patch. Views default to the newest Edition."],
  [
    "Mix-up board",
    "A coach's tree of guesses. Each situation pits the attacker's options (rows) against the defender's answers (columns); each cell is the attacker's payoff in damage points: damage dealt minus damage taken, plus what the position after it is worth by the board's value table, plus the value of the situation it leads to.",
  ],
  [
    "Value and mix",
    "The mix is how often each side should pick each option so that the other side cannot do better by changing alone; the value is what the attacker then earns per exchange on average. An option left out of the mix shows how much it gives up against the other side's mix.",
  ],
];

export default function HelpPage() {
  return (
    <div className="max-w-3xl space-y-8">
      <h1 className="text-2xl font-semibold">How to read Framefork</h1>
      <dl className="space-y-4">
        {TERMS.map(([term, meaning]) => (
          <div key={term}>
            <dt className="font-medium text-ink-100">{term}</dt>
            <dd className="text-ink-300">{meaning}</dd>
          </div>
        ))}
      </dl>
      <section aria-labelledby="breaks" className="rounded-lg border border-ink-800 bg-ink-900 p-4">
        <h2 id="breaks" className="font-medium">
          Take breaks
        </h2>
        <p className="mt-1 text-sm text-ink-300">
          Long practice sessions strain hands and wrists. Stop for a few minutes every hour, stretch, and stop at once
          if something hurts.
        </p>
      </section>
    </div>
  );
}
