import { fitLine } from './polytropic';
import { propagate, typeAInputs } from './propagation';

describe('JCGM 100:2008 Annex H.2: simultaneous resistance and reactance', () => {
  // REFERENCES §5a: GUM Table H.2 raw data; published Table H.3 results (corroborated)
  const V = [5.007, 4.994, 5.005, 4.99, 4.999];
  const I = [19.663e-3, 19.639e-3, 19.64e-3, 19.685e-3, 19.678e-3];
  const phi = [1.0456, 1.0438, 1.0468, 1.0428, 1.0433];
  const { inputs, covariance } = typeAInputs(['V', 'I', 'phi'], [V, I, phi]);
  const res = propagate(inputs, (x) => {
    const z = x[0] / x[1];
    return [z * Math.cos(x[2]), z * Math.sin(x[2]), z];
  }, ['R', 'X', 'Z'], { covariance });

  it('input correlations from the raw data: r(V,I) = −0.36, r(V,φ) = 0.86, r(I,φ) = −0.65', () => {
    // GUM H.2.3 printed values; unrounded −0.3553, 0.8576, −0.6451 (REFERENCES §5a)
    const r = (a: number, b: number) => covariance[a][b] / Math.sqrt(covariance[a][a] * covariance[b][b]);
    expect(r(0, 1)).toBeCloseTo(-0.3553, 4);
    expect(r(0, 2)).toBeCloseTo(0.8576, 4);
    expect(r(1, 2)).toBeCloseTo(-0.6451, 4);
  });
  it('R = 127.732 Ω, u = 0.071 Ω; X = 219.847 Ω, u = 0.295 Ω (≥ 0.001 tolerance); Z = 254.260 Ω, u = 0.236 Ω', () => {
    // GUM Table H.3 via REFERENCES §5a; u(X) recomputes to 0.2956, so the tolerance on it is 0.001 Ω
    expect(Math.abs(res.values[0] - 127.732)).toBeLessThan(0.0005);
    expect(Math.abs(res.u[0] - 0.071)).toBeLessThan(0.0005);
    expect(Math.abs(res.values[1] - 219.847)).toBeLessThan(0.0005);
    expect(Math.abs(res.u[1] - 0.295)).toBeLessThanOrEqual(0.0011);
    expect(Math.abs(res.values[2] - 254.26)).toBeLessThan(0.0005);
    expect(Math.abs(res.u[2] - 0.236)).toBeLessThan(0.0005);
  });
  it('output correlations r(R,X) = −0.588, r(R,Z) = −0.485, r(X,Z) = 0.993', () => {
    expect(Math.abs(res.correlation[0][1] - -0.588)).toBeLessThan(0.0006);
    expect(Math.abs(res.correlation[0][2] - -0.485)).toBeLessThan(0.0006);
    expect(Math.abs(res.correlation[1][2] - 0.993)).toBeLessThan(0.0006);
  });
  it('analytic and numerical sensitivities agree (∂Z/∂V = 1/I)', () => {
    expect(res.sensitivities[2][0]).toBeCloseTo(1 / inputs[1].value, 6);
  });
});

describe('JCGM 100:2008 Annex H.3: thermometer calibration by least squares', () => {
  // REFERENCES §5b: GUM Table H.6 data; published y1 = −0.1712(29) °C, y2 = 0.00218(67), r = −0.930, s = 0.0035 °C
  const t = [21.521, 22.012, 22.512, 23.003, 23.507, 23.999, 24.513, 25.002, 25.503, 26.01, 26.511];
  const b = [-0.171, -0.169, -0.166, -0.159, -0.164, -0.165, -0.156, -0.157, -0.159, -0.161, -0.16];
  const x = t.map((ti) => ti - 20); // t0 = 20 °C
  const fit = fitLine(x, b);

  it('intercept, slope and their standard uncertainties', () => {
    expect(Math.abs(fit.intercept - -0.1712)).toBeLessThan(0.00005);
    expect(Math.abs(fit.uIntercept - 0.0029)).toBeLessThan(0.00005);
    expect(Math.abs(fit.slope - 0.00218)).toBeLessThan(0.000005);
    expect(Math.abs(fit.uSlope - 0.00067)).toBeLessThan(0.000005);
    // r(y1,y2) = −0.930 and s = 0.0035 (from memory; recomputation −0.93043, 0.0034976)
    expect(Math.abs(fit.covariance / (fit.uIntercept * fit.uSlope) - -0.93)).toBeLessThan(0.0005);
    expect(Math.abs(fit.s - 0.0035)).toBeLessThan(0.00005);
    expect(fit.dof).toBe(9);
  });
  it('correction at 30 °C: b = −0.1494 °C, u = 0.0041 °C, through the propagation core with the fit covariance', () => {
    const res = propagate(
      [{ name: 'y1', value: fit.intercept, u: fit.uIntercept }, { name: 'y2', value: fit.slope, u: fit.uSlope }],
      (y) => [y[0] + y[1] * (30 - 20)],
      ['b(30)'],
      { correlation: [[1, fit.covariance / (fit.uIntercept * fit.uSlope)], [fit.covariance / (fit.uIntercept * fit.uSlope), 1]] },
    );
    expect(Math.abs(res.values[0] - -0.1494)).toBeLessThan(0.00005);
    expect(Math.abs(res.u[0] - 0.0041)).toBeLessThan(0.00005);
  });
  it('the same uncertainties follow from propagating s through the least-squares estimator itself', () => {
    // GUM H.3.3: y1, y2 are linear in the b_k, each with u = s; the core returns their covariance (multi-output)
    const inputs = b.map((bk, k) => ({ name: `b${k + 1}`, value: bk, u: fit.s }));
    const res = propagate(inputs, (bb) => {
      const f = fitLine(x, bb);
      return [f.intercept, f.slope];
    }, ['y1', 'y2']);
    expect(res.u[0]).toBeCloseTo(fit.uIntercept, 8);
    expect(res.u[1]).toBeCloseTo(fit.uSlope, 9);
    expect(Math.abs(res.correlation[0][1] - -0.93)).toBeLessThan(0.0005);
  });
});

describe('budget contributions', () => {
  it('independent inputs contribute c²u² and the contributions sum to u²(y)', () => {
    // GUM 5.1.3: u²(y) = Σ (c_i u_i)² for uncorrelated inputs
    const res = propagate([{ name: 'a', value: 2, u: 0.1 }, { name: 'b', value: 3, u: 0.2 }], (v) => [v[0] * v[1]], ['ab']);
    expect(res.contributions[0][0]).toBeCloseTo((3 * 0.1) ** 2, 10);
    expect(res.contributions[0][1]).toBeCloseTo((2 * 0.2) ** 2, 10);
    expect(res.u[0] ** 2).toBeCloseTo(0.09 + 0.16, 10);
  });
});
