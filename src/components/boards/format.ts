/** A probability as a whole percentage, or one decimal under 1%. */
export function formatShare(p: number): string {
  const pct = p * 100;
  if (pct > 0 && pct < 1) return `${pct.toFixed(1)}%`;
  return `${Math.round(pct)}%`;
}
