/**
 * EAP by brute force on a fine grid (posterior mean and SD of θ under a normal prior and the
 * Rasch likelihood): the definition, independent of the engine's Gauss–Hermite rule. `b`: item
 * difficulties; `x`: the 0/1 answers in the same order.
 * @see Bock, R. D., & Mislevy, R. J. (1982). Adaptive EAP estimation of ability in a
 *   microcomputer environment. Applied Psychological Measurement 6, 431–444 (eq. 1–2).
 */
export function bruteForceEap(
  b: number[],
  x: number[],
  mean: number,
  sd: number,
): { ability: number; se: number } {
  let w0 = 0;
  let w1 = 0;
  let w2 = 0;
  for (let k = 0; k <= 16000; k++) {
    const t = -10 + (20 * k) / 16000;
    let logL = -0.5 * ((t - mean) / sd) ** 2;
    for (let j = 0; j < b.length; j++) {
      const p = 1 / (1 + Math.exp(-(t - b[j]!)));
      logL += Math.log(x[j] === 1 ? p : 1 - p);
    }
    const w = Math.exp(logL);
    w0 += w;
    w1 += w * t;
    w2 += w * t * t;
  }
  const ability = w1 / w0;
  return { ability, se: Math.sqrt(w2 / w0 - ability * ability) };
}
