/**
 * The pair's small-signal (hybrid-π) network, solved exactly by nodal analysis.
 *
 * ```
 *            load 1          load 2          resistors: RC1, RC2 to signal ground
 *              │ c1            │ c2          mirror:    Q3 diode at c1, Q4 from c1 to c2
 *    b1 ──┤ Q1 (gm1, rπ1, ro1)   (gm2, rπ2, ro2) Q2 ├── b2
 *              │ x1            │ x2
 *              RE              RE            (x1, x2 merge with t when RE = 0)
 *              └──────┬────────┘
 *                     t
 *                    REE (tail)
 * ```
 *
 * The same stamp serves BJTs and MOSFETs (a MOSFET has 1/rπ = 0); PNP and PMOS mirror
 * devices have the same small-signal model as NPN and NMOS.
 *
 * @module
 */
import { _solveLinear } from "./_solve.ts";

/** One device's small-signal parameters, as conductances. */
export interface _SmallDevice {
  /** Transconductance gm in S. */
  gm: number;
  /** 1/rπ in S (0 for a MOSFET). */
  gpi: number;
  /** 1/ro in S (0 without Early effect). */
  go: number;
}

/** The load of the pair, small-signal. */
export type _SmallLoad =
  | { kind: "resistors"; g1: number; g2: number }
  | { kind: "mirror"; q3: _SmallDevice; q4: _SmallDevice };

/** The whole pair, small-signal. */
export interface _PairNetwork {
  q1: _SmallDevice;
  q2: _SmallDevice;
  /** Degeneration resistance in each emitter/source, Ω (0 for none). */
  degeneration: number;
  /** 1/REE in S (0 for an ideal tail). */
  tailConductance: number;
  load: _SmallLoad;
}

/** Node voltages and input currents for one drive. */
export interface _Drive {
  c1: number;
  c2: number;
  ib1: number;
  ib2: number;
}

/** The network's responses. */
export interface _PairResponse {
  /** Drive vb1 = +½, vb2 = −½ (vid = 1 V). */
  differential: _Drive;
  /** Drive vb1 = vb2 = 1 V. */
  commonMode: _Drive;
  /** Resistance at c2 with the inputs at signal ground (NaN unless asked for). */
  outputResistance: number;
  /** Resistance between c2 and c1 with the inputs at signal ground (NaN unless asked for). */
  differentialOutputResistance: number;
}

const B1 = 0, B2 = 1, T = 2, X1 = 3, X2 = 4, C1 = 5, C2 = 6, N = 7;

// Scratch space, reused by every call: the Monte Carlo solves this network 10⁵ times.
const G = new Float64Array(N * N);
const M = new Float64Array(25);
const R = new Float64Array(20);
const UNKNOWNS_PLAIN = [T, C1, C2];
const UNKNOWNS_DEGENERATED = [T, X1, X2, C1, C2];

/**
 * Resistive loads and no Early effect: each side is an emitter branch of conductance
 * y = 1/(1/(gm + gπ) + RE) passing a fraction a = gm/(gm + gπ) (= α) to its collector, so the
 * tail node is the weighted mean ve = (y1·vb1 + y2·vb2)/(y1 + y2 + 1/REE): the same exact
 * solution as the nodal one, without the matrix (the Monte Carlo's hot path).
 */
function solveWithoutEarly(network: _PairNetwork, g1: number, g2: number): _PairResponse {
  const { q1, q2, degeneration, tailConductance } = network;
  const y1 = 1 / (1 / (q1.gm + q1.gpi) + degeneration);
  const y2 = 1 / (1 / (q2.gm + q2.gpi) + degeneration);
  const a1 = q1.gm / (q1.gm + q1.gpi);
  const a2 = q2.gm / (q2.gm + q2.gpi);
  const total = y1 + y2 + tailConductance;
  const drive = (vb1: number, vb2: number): _Drive => {
    const ve = (y1 * vb1 + y2 * vb2) / total;
    const ie1 = y1 * (vb1 - ve);
    const ie2 = y2 * (vb2 - ve);
    return {
      c1: (-a1 * ie1) / g1,
      c2: (-a2 * ie2) / g2,
      ib1: (1 - a1) * ie1,
      ib2: (1 - a2) * ie2,
    };
  };
  return {
    differential: drive(0.5, -0.5),
    commonMode: drive(1, 1),
    outputResistance: 1 / g2,
    differentialOutputResistance: 1 / g1 + 1 / g2,
  };
}

function stamp(b: number, e: number, c: number, device: _SmallDevice): void {
  // Rows hold currents leaving each node: ic = gm(vb − ve) + go(vc − ve), ib = gpi(vb − ve);
  // -1 is signal ground.
  const { gm, gpi, go } = device;
  if (c >= 0) {
    if (b >= 0) G[c * N + b] += gm;
    if (e >= 0) G[c * N + e] -= gm + go;
    G[c * N + c] += go;
  }
  if (e >= 0) {
    if (b >= 0) G[e * N + b] -= gm + gpi;
    G[e * N + e] += gm + go + gpi;
    if (c >= 0) G[e * N + c] -= go;
  }
  if (b >= 0) {
    G[b * N + b] += gpi;
    if (e >= 0) G[b * N + e] -= gpi;
  }
}

/**
 * Solves the pair network for a differential and a common-mode drive (and, if asked, the
 * output resistances). Throws if the network is singular (an active load with no Early effect
 * anywhere leaves the output node without a DC path; the callers prevent that).
 */
export function _solvePair(network: _PairNetwork, withOutputResistance = false): _PairResponse {
  const load = network.load;
  if (load.kind === "resistors" && network.q1.go === 0 && network.q2.go === 0) {
    return solveWithoutEarly(network, load.g1, load.g2);
  }
  const k = withOutputResistance ? 4 : 2;
  G.fill(0);
  const degenerated = network.degeneration > 0;
  const x1 = degenerated ? X1 : T;
  const x2 = degenerated ? X2 : T;
  stamp(B1, x1, C1, network.q1);
  stamp(B2, x2, C2, network.q2);
  G[T * N + T] += network.tailConductance;
  if (degenerated) {
    const g = 1 / network.degeneration;
    for (const x of [X1, X2]) {
      G[x * N + x] += g;
      G[T * N + T] += g;
      G[x * N + T] -= g;
      G[T * N + x] -= g;
    }
  }
  if (load.kind === "resistors") {
    G[C1 * N + C1] += load.g1;
    G[C2 * N + C2] += load.g2;
  } else {
    stamp(C1, -1, C1, load.q3);
    stamp(C1, -1, C2, load.q4);
  }
  // The inputs are driven, so their columns move to the right-hand side:
  // column 0 is vb1 = +½, vb2 = −½; column 1 is vb1 = vb2 = 1; columns 2 and 3 inject 1 A.
  const unknowns = degenerated ? UNKNOWNS_DEGENERATED : UNKNOWNS_PLAIN;
  const n = unknowns.length;
  for (let i = 0; i < n; i++) {
    const row = unknowns[i];
    for (let j = 0; j < n; j++) M[i * n + j] = G[row * N + unknowns[j]];
    const g1 = G[row * N + B1];
    const g2 = G[row * N + B2];
    R[i * k] = -0.5 * g1 + 0.5 * g2;
    R[i * k + 1] = -g1 - g2;
    if (withOutputResistance) {
      R[i * k + 2] = row === C2 ? 1 : 0;
      R[i * k + 3] = row === C2 ? 1 : row === C1 ? -1 : 0;
    }
  }
  if (!_solveLinear(M, R, n, k)) {
    throw new RangeError("The pair's small-signal network is singular (no DC path at an output)");
  }
  const c1 = n - 2;
  const c2 = n - 1;
  const e1 = degenerated ? 1 : 0;
  const e2 = degenerated ? 2 : 0;
  const drive = (j: number, vb1: number, vb2: number): _Drive => ({
    c1: R[c1 * k + j],
    c2: R[c2 * k + j],
    ib1: network.q1.gpi * (vb1 - R[e1 * k + j]),
    ib2: network.q2.gpi * (vb2 - R[e2 * k + j]),
  });
  return {
    differential: drive(0, 0.5, -0.5),
    commonMode: drive(1, 1, 1),
    outputResistance: withOutputResistance ? R[c2 * k + 2] : Number.NaN,
    differentialOutputResistance: withOutputResistance ? R[c2 * k + 3] - R[c1 * k + 3] : Number.NaN,
  };
}
