// The run's reduced model: W, Q, ΔU and r = ΔU − (Q − W) as functions of a few dozen aggregated inputs
// (per-instrument gains and offsets, constants, and the per-reading random parts), built once in O(N).
//
// Where it is exact and where it is linearised:
// - Systematic parts are exact: a gain a and offset b per instrument turn ∫P dV, ∫U·I dt and ∫(T − T_amb) dt
//   into polynomials in (a, b) whose coefficients are sums precomputed once (S(P,V), S(gP,V), ΔV, ...).
// - ΔU is exact per evaluation: it depends on T at the first and last reading only, so the nonlinear NASA-polynomial
//   ∫Cv dT and n = P1V1/(ZRT1) are re-evaluated for every draw, with the first and last readings' random
//   errors drawn explicitly.
// - The random errors of the interior readings are linearised: each enters W or Q through a fixed
//   sensitivity c_i (e.g. ∂W/∂P_i = (V_{i+1} − V_{i−1})/2), so their sum is one normal deviate per channel
//   with variance Σc_i²u². Dropped: products of two random errors (zero mean, second order) and the change of
//   c_i under the systematic errors (second order); both are negligible when per-reading noise is small
//   against the swing of the path. The normal shape follows from the central limit theorem for many readings.
import { cvIntegral, type HeatCapacityModel } from './gases';
import { DEPARTURE_RELATIVE_U, departureAtPressure, departureAtVolume, type CriticalConstants } from './real-gas';
import type { Distribution } from './monte-carlo';
import type { ChannelSeries, RunSeries } from './series';
import { R_GAS } from './units';

export type SourceKind = 'systematic' | 'random' | 'constant';

export interface ModelInput {
  name: string;
  /** Instrument id or constant name; budgets are grouped by it. */
  group: string;
  kind: SourceKind;
  unit: string;
  value: number;
  u: number;
  distribution: Distribution;
}

export interface RunModel {
  inputs: ModelInput[];
  /** [W, Q, ΔU, r] in J at the given inputs. */
  evaluate(x: Float64Array): number[];
  /** Electrical heat ∫U·I dt (or ∫P dt) alone, J: the known heat of an electrical standardization. */
  electrical(x: Float64Array): number[];
  /** r only (the Monte Carlo hot path). */
  residual(x: Float64Array): number;
  nominal: {
    W: number; Qel: number; leak: number; wall: number; Q: number; dU: number; r: number; n: number | null; T1: number; T2: number; leakIntegral: number;
    /** n·∫Cv dT alone, and the real-gas departure n·[(U − U°)₂ − (U − U°)₁], J (0 without a departure). */
    dUideal: number; dUdeparture: number;
  };
  /** How the real-gas departure was evaluated, or why it was not. */
  departureMethod: string | null;
}

/** The real-gas departure to add to ΔU: the species' critical constants (null: ideal gas only). */
export interface RealGasOption {
  critical: CriticalConstants;
}

interface Sums {
  // work: W' = S_PV + a·S_gPV + β·ΔV + c·S_PgV + a·c·S_gPgV + β·c·ΔgV
  SPV: number; SgPV: number; SPgV: number; SgPgV: number; dV: number; dgV: number;
  // electrical: ∫U·I, ∫U, ∫I, ∫Pw, total time
  SUI: number; SU: number; SI: number; SPw: number; tTot: number;
  // leak: ∫T dt, ∫gT dt
  ST: number; SgT: number;
}


export function buildRunModel(series: RunSeries, gasModel: HeatCapacityModel | null, realGas: RealGasOption | null = null): RunModel {
  const { N, t, P, V, T, U, I, Pw } = series;
  const last = N - 1;
  const s: Sums = { SPV: 0, SgPV: 0, SPgV: 0, SgPgV: 0, dV: 0, dgV: 0, SUI: 0, SU: 0, SI: 0, SPw: 0, tTot: t[last] - t[0], ST: 0, SgT: 0 };
  // Trapezoid weight of reading i in time, w_i = (t_{i+1} − t_{i−1})/2 (halves at the ends).
  const weight = (i: number) => 0.5 * ((i < last ? t[i + 1] : t[i]) - (i > 0 ? t[i - 1] : t[i]));
  // Per-reading sensitivities enter only as sums of squares over the interior readings and as values at the
  // two ends, so they are accumulated here without per-reading arrays (10⁶ readings stay cheap).
  let cP1 = 0, cPN = 0, cV1 = 0, cVN = 0, ssP = 0, ssV = 0;
  if (P && V) {
    const p = P.si, gp = P.gainBasis, v = V.si, gv = V.gainBasis;
    for (let i = 0; i < last; i++) {
      const pa = 0.5 * (p[i] + p[i + 1]);
      const ga = 0.5 * (gp[i] + gp[i + 1]);
      const dv = v[i + 1] - v[i];
      const dg = gv[i + 1] - gv[i];
      s.SPV += pa * dv;
      s.SgPV += ga * dv;
      s.SPgV += pa * dg;
      s.SgPgV += ga * dg;
    }
    for (let i = 1; i < last; i++) {
      const cp = 0.5 * (v[i + 1] - v[i - 1]); // ∂W/∂P_i = (V_{i+1} − V_{i−1})/2
      const cv = 0.5 * (p[i - 1] - p[i + 1]); // ∂W/∂V_i = (P_{i−1} − P_{i+1})/2
      ssP += cp * cp;
      ssV += cv * cv;
    }
    cP1 = 0.5 * (v[1] - v[0]);
    cPN = 0.5 * (v[last] - v[last - 1]);
    cV1 = -0.5 * (p[0] + p[1]);
    cVN = 0.5 * (p[last - 1] + p[last]);
    s.dV = v[last] - v[0];
    s.dgV = gv[last] - gv[0];
  }
  let ssU = 0, ssI = 0, ssW = 0;
  for (let i = 0; i < N; i++) {
    const wi = weight(i);
    const interior = i > 0 && i < last;
    if (U && I) {
      const ui = U.si[i], ii = I.si[i];
      s.SUI += wi * ui * ii;
      s.SU += wi * ui;
      s.SI += wi * ii;
      if (interior) {
        ssU += wi * ii * wi * ii; // ∂Q/∂U_i = w_i·I_i
        ssI += wi * ui * wi * ui; // ∂Q/∂I_i = w_i·U_i
      }
    }
    if (Pw) s.SPw += wi * Pw.si[i];
    s.ST += wi * T.si[i];
    s.SgT += wi * T.gainBasis[i];
    if (interior) ssW += wi * wi;
  }
  const wT1 = weight(0), wTN = weight(last);

  const inputs: ModelInput[] = [];
  const slot = (name: string, group: string, kind: SourceKind, unit: string, value: number, u: number, distribution: Distribution): number => {
    if (!(u > 0)) return -1;
    inputs.push({ name, group, kind, unit, value, u, distribution });
    return inputs.length - 1;
  };
  interface ChannelSlots { gain: number; fs: number; cal: number; first: number; lastR: number; interior: number; interiorK: number }
  const channelSlots = (ch: ChannelSeries | undefined, unit: string, sumSquares: number): ChannelSlots => {
    if (!ch) return { gain: -1, fs: -1, cal: -1, first: -1, lastR: -1, interior: -1, interiorK: 0 };
    const k = ch.comps;
    const uRand = k.random * ch.factor;
    const interiorK = Math.sqrt(sumSquares); // root-sum-square of the interior sensitivities
    return {
      gain: slot(`${ch.label} gain (% of reading)`, ch.group, 'systematic', '1', 0, k.gain, 'rectangular'),
      fs: slot(`${ch.label} offset (% of full scale)`, ch.group, 'systematic', unit, 0, k.fullScaleOffset * ch.factor, 'rectangular'),
      cal: slot(`${ch.label} calibration`, ch.group, 'systematic', unit, 0, k.calibrationOffset * ch.factor, 'normal'),
      first: slot(`${ch.label} random, first reading`, ch.group, 'random', unit, 0, uRand, k.randomDistribution),
      lastR: slot(`${ch.label} random, last reading`, ch.group, 'random', unit, 0, uRand, k.randomDistribution),
      interior: interiorK > 0 ? slot(`${ch.label} random (per reading, ${N - 2} readings)`, ch.group, 'random', unit, 0, uRand, 'normal') : -1,
      interiorK,
    };
  };
  const hasW = !!(P && V);
  const calorimeter = gasModel === null;
  // The real-gas departure reads the absolute pressure at the two ends, else the molar volume there.
  const departure: 'pressure' | 'volume' | null = calorimeter || !realGas ? null : P ? 'pressure' : V ? 'volume' : null;
  const sP = channelSlots(hasW || series.amount.kind === 'initialState' || departure === 'pressure' ? P : undefined, 'Pa', ssP);
  const sV = channelSlots(V && V.label !== 'vessel volume' ? V : undefined, 'm3', ssV);
  const sT = channelSlots(T, 'K', series.heatLoss ? ssW : 0);
  const sU = channelSlots(U, 'V', ssU);
  const sI = channelSlots(I, 'A', ssI);
  const sPw = channelSlots(Pw, 'W', ssW);
  const baro = series.ambientPressure;
  const iPamb = series.gauge && baro ? slot(baro.label ?? 'barometric (ambient) pressure', baro.group ?? 'ambient pressure', 'systematic', 'Pa', 0, baro.u, 'normal') : -1;
  const iBore = series.boreGain ? slot('piston bore (area)', 'piston bore', 'systematic', '1', 0, series.boreGain, 'normal') : -1;
  const iVoff = slot(V?.label === 'vessel volume' ? 'vessel volume' : 'dead volume', 'apparatus volume', 'systematic', 'm3', 0, series.volumeOffsetU, 'normal');
  const Ta = series.ambientTemperature;
  const iTa = Ta && series.heatLoss ? slot('ambient temperature', 'ambient temperature', 'constant', 'K', Ta.value, Ta.u, 'normal') : -1;
  const h = series.heatLoss;
  const iH = h ? slot('heat-loss coefficient h', 'heat-loss coefficient', 'constant', 'W/K', h.value, h.u, 'normal') : -1;
  const wall = series.wallUptake;
  const iWall = wall ? slot('wall uptake', 'wall uptake', 'constant', 'J', wall.value, wall.u, 'normal') : -1;
  // C is the calorimeter's whole heat capacity on a calorimetric run, and the vessel wall's on a gas run, where the
  // wall takes up C·(T_last − T_first) of the heat (DESIGN §2, heat).
  const C = series.heatCapacity;
  const iC = C ? slot(calorimeter ? 'calorimeter heat capacity C' : 'vessel wall heat capacity C (wall uptake C·ΔT)', 'heat capacity', 'constant', 'J/K', C.value, C.u, 'normal') : -1;
  const iDep = departure ? slot('real-gas departure (Tsonopoulos B(T), relative)', 'real-gas departure', 'constant', '1', 0, DEPARTURE_RELATIVE_U, 'normal') : -1;
  const am = series.amount;
  const iN = am.kind === 'moles' ? slot('amount n', 'amount', 'constant', 'mol', am.n.value, am.n.u, 'normal') : -1;
  const iM = am.kind === 'mass' ? slot('gas mass m', 'amount', 'constant', 'kg', am.m.value, am.m.u, 'normal') : -1;
  const iMM = am.kind === 'mass' ? slot('molar mass M', 'amount', 'constant', 'kg/mol', am.M.value, am.M.u, 'normal') : -1;
  const iZ = am.kind === 'initialState' ? slot('compressibility Z', 'amount', 'constant', '1', am.Z.value, am.Z.u, 'normal') : -1;

  const p1 = P ? P.si[0] : NaN, gp1 = P ? P.gainBasis[0] : 0;
  const pN = P ? P.si[last] : NaN, gpN = P ? P.gainBasis[last] : 0;
  const v1 = V ? V.si[0] : NaN, gv1 = V ? V.gainBasis[0] : 0;
  const vN = V ? V.si[last] : NaN, gvN = V ? V.gainBasis[last] : 0;
  const T1 = T.si[0], TN = T.si[last], gT1 = T.gainBasis[0], gTN = T.gainBasis[last];
  const TaNom = Ta?.value ?? 0;
  const hNom = h?.value ?? 0;
  const wallNom = wall?.value ?? 0;
  const CNom = C?.value ?? 0;
  const Uend = U ? [U.si[0], U.si[last]] : [0, 0];
  const Iend = I ? [I.si[0], I.si[last]] : [0, 0];

  const g = (x: Float64Array, i: number, dflt: number) => (i >= 0 ? x[i] : dflt);
  const z = (x: Float64Array, i: number) => (i >= 0 ? x[i] : 0);

  const out = new Float64Array(13);
  const parts = (x: Float64Array): number => {
    // Work (exact in the systematic parts, linear in the per-reading random parts).
    let W = 0;
    const aP = z(x, sP.gain);
    const betaP = z(x, sP.fs) + z(x, sP.cal) + z(x, iPamb);
    const cGain = (1 + z(x, sV.gain)) * (1 + z(x, iBore)) - 1;
    if (hasW) {
      W = s.SPV + aP * s.SgPV + betaP * s.dV + cGain * s.SPgV + aP * cGain * s.SgPgV + betaP * cGain * s.dgV
        + cP1 * z(x, sP.first) + cPN * z(x, sP.lastR) + sP.interiorK * z(x, sP.interior)
        + cV1 * z(x, sV.first) + cVN * z(x, sV.lastR) + sV.interiorK * z(x, sV.interior);
    }
    // Electrical heat: ∫(U(1+a_U)+b_U)(I(1+a_I)+b_I) dt expanded.
    let Qel = 0;
    if (U && I) {
      const aU = z(x, sU.gain), bU = z(x, sU.fs) + z(x, sU.cal);
      const aI = z(x, sI.gain), bI = z(x, sI.fs) + z(x, sI.cal);
      Qel = (1 + aU) * (1 + aI) * s.SUI + (1 + aU) * bI * s.SU + (1 + aI) * bU * s.SI + bU * bI * s.tTot
        + wT1 * (Iend[0] * z(x, sU.first) + Uend[0] * z(x, sI.first)) + wTN * (Iend[1] * z(x, sU.lastR) + Uend[1] * z(x, sI.lastR))
        + sU.interiorK * z(x, sU.interior) + sI.interiorK * z(x, sI.interior);
    } else if (Pw) {
      Qel = (1 + z(x, sPw.gain)) * s.SPw + (z(x, sPw.fs) + z(x, sPw.cal)) * s.tTot
        + wT1 * z(x, sPw.first) + wTN * z(x, sPw.lastR) + sPw.interiorK * z(x, sPw.interior);
    }
    // Temperatures: common gain and offset, explicit random errors at the two ends.
    const aT = z(x, sT.gain), bT = z(x, sT.fs) + z(x, sT.cal);
    const eT1 = z(x, sT.first), eTN = z(x, sT.lastR);
    let leak = 0;
    let leakIntegral = 0;
    if (h) {
      leakIntegral = s.ST + aT * s.SgT + bT * s.tTot - g(x, iTa, TaNom) * s.tTot + wT1 * eT1 + wTN * eTN + sT.interiorK * z(x, sT.interior);
      leak = g(x, iH, hNom) * leakIntegral;
    }
    const T1x = T1 + aT * gT1 + bT + eT1;
    const TNx = TN + aT * gTN + bT + eTN;
    // Wall uptake: a fixed amount as entered, plus C·ΔT of a gas vessel's wall (the temperature offset cancels).
    const wallQ = g(x, iWall, wallNom) + (!calorimeter && C ? g(x, iC, CNom) * (TNx - T1x) : 0);
    const Q = Qel - leak - wallQ;
    let dU: number;
    let dUideal: number;
    let dUdep = 0;
    let n: number | null = null;
    if (calorimeter) dU = dUideal = g(x, iC, CNom) * (TNx - T1x); // ΔU = C·ΔT
    else {
      // Volume offsets (channel full scale and calibration, dead or vessel volume) shift V1 and so n.
      const volumeOffset = z(x, iVoff) + z(x, sV.fs) + z(x, sV.cal);
      if (am.kind === 'moles') n = g(x, iN, am.n.value);
      else if (am.kind === 'mass') n = g(x, iM, am.m.value) / g(x, iMM, am.M.value); // n = m/M
      else {
        const P1x = p1 + aP * gp1 + betaP + z(x, sP.first);
        const V1x = v1 + cGain * gv1 + volumeOffset + z(x, sV.first);
        n = (P1x * V1x) / (g(x, iZ, am.kind === 'initialState' ? am.Z.value : 1) * R_GAS * T1x); // n = PV/(ZRT)
      }
      dUideal = n * cvIntegral(gasModel!, T1x, TNx); // ΔU° = n∫Cv dT
      if (departure === 'pressure') {
        const P1x = p1 + aP * gp1 + betaP + z(x, sP.first);
        const PNx = pN + aP * gpN + betaP + z(x, sP.lastR);
        dUdep = n * (departureAtPressure(realGas!.critical, TNx, PNx) - departureAtPressure(realGas!.critical, T1x, P1x));
      } else if (departure === 'volume') {
        const V1x = v1 + cGain * gv1 + volumeOffset + z(x, sV.first);
        const VNx = vN + cGain * gvN + volumeOffset + z(x, sV.lastR);
        dUdep = n * (departureAtVolume(realGas!.critical, TNx, VNx / n) - departureAtVolume(realGas!.critical, T1x, V1x / n));
      }
      dUdep *= 1 + z(x, iDep);
      dU = dUideal + dUdep;
    }
    // Written into a reused buffer: the Monte Carlo calls this 10⁵ times and must not allocate.
    out[0] = W; out[1] = Qel; out[2] = leak; out[3] = wallQ; out[4] = Q; out[5] = dU; out[6] = dU - (Q - W);
    out[7] = n ?? NaN; out[8] = T1x; out[9] = TNx; out[10] = leakIntegral; out[11] = dUideal; out[12] = dUdep;
    return out[6];
  };

  const x0 = Float64Array.from(inputs.map((q) => q.value));
  parts(x0);
  const nominal = {
    W: out[0], Qel: out[1], leak: out[2], wall: out[3], Q: out[4], dU: out[5], r: out[6],
    n: Number.isNaN(out[7]) ? null : out[7], T1: out[8], T2: out[9], leakIntegral: out[10], dUideal: out[11], dUdeparture: out[12],
  };
  const departureMethod = calorimeter ? null : !realGas ? 'ideal gas (no real-gas departure)'
    : departure === 'pressure' ? 'second-virial departure −n·T·P·dB/dT at the first and last reading (Tsonopoulos 1974)'
    : departure === 'volume' ? 'second-virial departure −n·R·T²·(dB/dT)/V_m at the first and last reading (Tsonopoulos 1974)'
    : 'no real-gas departure: neither pressure nor volume is known';
  return {
    inputs,
    evaluate: (x) => {
      parts(x);
      return [out[0], out[4], out[5], out[6]];
    },
    electrical: (x) => {
      parts(x);
      return [out[1]];
    },
    residual: parts,
    nominal,
    departureMethod,
  };
}
