// Learning from the reviewer: a logistic model over the score's contributions and the class pair,
// starting from today's weights and refitted from the verdicts given, re-ranks the rest of the queue.

/** One judged item for the fit: its features and whether it was judged a label mistake (1) or a model error (0). */
export interface VerdictSample {
  x: readonly number[];
  y: 0 | 1;
}

/**
 * Returns θ minimising the negative log-likelihood of the logistic model p = σ(θ·x) over `samples`
 * plus (λ/2)‖θ − θ0‖² (a Gaussian prior centred on today's weights θ0, so few verdicts move the
 * model a little and many move it far), by Newton's method (the objective is strictly convex for
 * λ > 0). Stops when a step changes no coordinate by more than 1e-12, or after 100 steps.
 */
export function logisticFit(samples: readonly VerdictSample[], theta0: readonly number[], lambda: number): number[] {
  const d = theta0.length;
  const theta = [...theta0];
  for (let iter = 0; iter < 100; iter++) {
    const grad = theta.map((t, j) => lambda * (t - theta0[j]));
    const hess = Array.from({ length: d }, (_, i) => Array.from({ length: d }, (_, j) => (i === j ? lambda : 0)));
    for (const s of samples) {
      let z = 0;
      for (let j = 0; j < d; j++) z += theta[j] * s.x[j];
      const p = 1 / (1 + Math.exp(-z));
      const w = p * (1 - p);
      for (let i = 0; i < d; i++) {
        grad[i] += (p - s.y) * s.x[i];
        for (let j = 0; j < d; j++) hess[i][j] += w * s.x[i] * s.x[j];
      }
    }
    const step = linearSolve(hess, grad);
    let most = 0;
    for (let j = 0; j < d; j++) {
      theta[j] -= step[j];
      most = Math.max(most, Math.abs(step[j]));
    }
    if (most <= 1e-12) break;
  }
  return theta;
}

/** Returns x with A x = b (A symmetric positive definite here), by Gaussian elimination with partial pivoting. */
function linearSolve(a: number[][], b: number[]): number[] {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[piv][c])) piv = r;
    [m[c], m[piv]] = [m[piv], m[c]];
    for (let r = c + 1; r < n; r++) {
      const f = m[r][c] / m[c][c];
      for (let k = c; k <= n; k++) m[r][k] -= f * m[c][k];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = m[r][n];
    for (let k = r + 1; k < n; k++) s -= m[r][k] * x[k];
    x[r] = s / m[r][r];
  }
  return x;
}
