// Law of propagation of uncertainty (JCGM 100:2008, GUM §5.1–5.2 and H.2): u²(y) = c Σ_x cᵀ for any
// model of named inputs, several outputs at once, with their covariances (GUM F.1.2.3 / JCGM 102 §6).
import { mean, sampleCovariance } from 'simple-statistics';

export interface InputQuantity {
  name: string;
  value: number;
  /** Standard uncertainty u(x). */
  u: number;
}

export type ModelFunction = (x: Float64Array) => number[];

export interface PropagationOptions {
  /** Full input covariance matrix; overrides u and `correlation`. */
  covariance?: number[][];
  /** Input correlation coefficients r(x_i, x_j). */
  correlation?: number[][];
  /** Analytic Jacobian ∂y_k/∂x_j; numerical central differences otherwise. */
  jacobian?: (x: Float64Array) => number[][];
}

export interface PropagationResult {
  outputs: string[];
  values: number[];
  u: number[];
  /** Sensitivity coefficients c[k][j] = ∂y_k/∂x_j. */
  sensitivities: number[][];
  covariance: number[][];
  correlation: number[][];
  /** Each input's contribution to u²(y_k): c_j·Σ_l cov_jl·c_l (GUM 5.2.2; = c_j²u_j² when independent). */
  contributions: number[][];
}

export function inputCovariance(inputs: readonly InputQuantity[], options: PropagationOptions = {}): number[][] {
  if (options.covariance) return options.covariance;
  const n = inputs.length;
  const corr = options.correlation;
  const cov: number[][] = [];
  for (let i = 0; i < n; i++) {
    cov.push(new Array<number>(n).fill(0));
    for (let j = 0; j < n; j++) {
      const r = i === j ? 1 : (corr?.[i]?.[j] ?? 0);
      cov[i][j] = r * inputs[i].u * inputs[j].u;
    }
  }
  return cov;
}

/** Central differences with a step small against u (the model is linearised over ±u, GUM 5.1.2). */
export function numericalJacobian(model: ModelFunction, x0: Float64Array, steps: readonly number[]): number[][] {
  const m = x0.length;
  const x = Float64Array.from(x0);
  let jac: number[][] | null = null;
  for (let j = 0; j < m; j++) {
    const h = steps[j];
    x[j] = x0[j] + h;
    const up = model(x);
    x[j] = x0[j] - h;
    const down = model(x);
    x[j] = x0[j];
    if (!jac) jac = up.map(() => new Array<number>(m).fill(0));
    for (let k = 0; k < up.length; k++) jac[k][j] = (up[k] - down[k]) / (2 * h);
  }
  return jac ?? model(x0).map(() => []);
}

export function propagate(
  inputs: readonly InputQuantity[],
  model: ModelFunction,
  outputs: readonly string[],
  options: PropagationOptions = {},
): PropagationResult {
  const x0 = Float64Array.from(inputs.map((q) => q.value));
  const values = model(x0);
  if (values.length !== outputs.length) throw new Error('model returned a different number of outputs than named');
  const steps = inputs.map((q) => (q.u > 0 ? q.u * 1e-3 : Math.max(Math.abs(q.value), 1) * 1e-7));
  const c = options.jacobian ? options.jacobian(x0) : numericalJacobian(model, x0, steps);
  const cov = inputCovariance(inputs, options);
  const m = inputs.length;
  const p = outputs.length;
  // cΣ: one pass per output keeps the cost at p·m² (m is small: the inputs are aggregated sources).
  const cSigma = c.map((row) => {
    const out = new Array<number>(m).fill(0);
    for (let j = 0; j < m; j++) {
      if (row[j] === 0) continue;
      const cj = row[j];
      const covj = cov[j];
      for (let l = 0; l < m; l++) out[l] += cj * covj[l];
    }
    return out;
  });
  const covariance: number[][] = [];
  for (let a = 0; a < p; a++) {
    covariance.push(new Array<number>(p).fill(0));
    for (let b = 0; b < p; b++) {
      let s = 0;
      for (let l = 0; l < m; l++) s += cSigma[a][l] * c[b][l];
      covariance[a][b] = s;
    }
  }
  const u = covariance.map((row, a) => Math.sqrt(Math.max(row[a], 0)));
  const correlation = covariance.map((row, a) => row.map((v, b) => (u[a] > 0 && u[b] > 0 ? v / (u[a] * u[b]) : a === b ? 1 : 0)));
  const contributions = c.map((row, a) => row.map((cj, j) => cj * cSigma[a][j]));
  return { outputs: [...outputs], values, u, sensitivities: c, covariance, correlation, contributions };
}

/**
 * Type A evaluation of repeated simultaneous observations (GUM 4.2 and H.2.3): input estimates are the
 * means, their covariance s(x̄_i, x̄_j) = s(x_i, x_j)/n from the sample covariance.
 */
export function typeAInputs(names: readonly string[], columns: readonly number[][]): { inputs: InputQuantity[]; covariance: number[][] } {
  const n = columns[0].length;
  const covariance = columns.map((a) => columns.map((b) => sampleCovariance(a, b) / n));
  const inputs = columns.map((col, i) => ({ name: names[i], value: mean(col), u: Math.sqrt(covariance[i][i]) }));
  return { inputs, covariance };
}
