type Highs = Awaited<ReturnType<(typeof import("highs"))["default"]>>;

/** HiGHS (npm `highs`), loaded once per test file. */
export async function loadHighs(): Promise<Highs> {
  return (await import("highs")).default();
}

/**
 * The value of the zero-sum game with these row-player payoffs from HiGHS, stated without any
 * shift: max v s.t. x·A_j >= v, sum x = 1, v free.
 */
export function highsValue(highs: Highs, payoff: readonly (readonly number[])[]): number {
  const rows = payoff.length;
  const cols = payoff[0]!.length;
  // Plain decimals (12 places): no exponent notation in the LP file.
  const term = (c: number, name: string) => `${c < 0 ? "-" : "+"} ${Math.abs(c).toFixed(12)} ${name}`;
  const lines = ["Maximize", " obj: v", "Subject To"];
  for (let j = 0; j < cols; j++) {
    lines.push(` c${j}: ${payoff.map((r, i) => term(r[j]!, `x${i}`)).join(" ")} - v >= 0`);
  }
  lines.push(` total: ${Array.from({ length: rows }, (_, i) => `+ x${i}`).join(" ")} = 1`);
  lines.push("Bounds", " v free", "End");
  const result = highs.solve(lines.join("\n"), { output_flag: false });
  if (result.Status !== "Optimal") throw new Error(`HiGHS: ${result.Status}`);
  return result.ObjectiveValue;
}
