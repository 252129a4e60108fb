/**
 * Closed-form data for the chart tests, snapshots and bench: every curve here has a formula,
 * so a snapshot diff can only come from the drawing, never from the data.
 *
 * @module
 */
import {
  dissipationChart,
  gainPhaseChart,
  harmonicSpectrumChart,
  monteCarloChart,
  operatingAreaBoundary,
  operatingAreaChart,
  sweepChart,
  thdChart,
  transferCurveChart,
} from "longtail/charts";
import type { Chart, FrequencyPoint } from "longtail/charts";

/** Thermal voltage kT/q at 300 K, V (CODATA 2018 exact k and q). */
export const VT300 = 1.380649e-23 * 300 / 1.602176634e-19;

const DEG = 180 / Math.PI;

/** Loop gain A0 / ((1 + jf/p1)(1 + jf/p2)) sampled `perDecade` points per decade. */
export function twoPoleResponse(
  a0: number,
  p1: number,
  p2: number,
  from: number,
  to: number,
  perDecade = 20,
): FrequencyPoint[] {
  const points: FrequencyPoint[] = [];
  const decades = Math.log10(to / from);
  for (let k = 0; k <= Math.round(decades * perDecade); k++) {
    const f = from * 10 ** (k / perDecade);
    const x1 = f / p1;
    const x2 = f / p2;
    points.push({
      frequency: f,
      gainDb: 20 * Math.log10(a0) - 10 * Math.log10(1 + x1 * x1) - 10 * Math.log10(1 + x2 * x2),
      phaseDeg: -(Math.atan(x1) + Math.atan(x2)) * DEG,
    });
  }
  return points;
}

/** Differential output current of a bipolar pair, Iee·tanh(vid / 2VT), at 300 K. */
export function pairCurve(tailCurrent: number, span: number, count: number) {
  return Array.from({ length: count }, (_, i) => {
    const input = -span + (2 * span * i) / (count - 1);
    return { input, output: tailCurrent * Math.tanh(input / (2 * VT300)) };
  });
}

/** Class-B follower with a dead band: out = sign(in)·max(|in| − dead, 0)·gain. */
export function deadBandCurve(dead: number, gain: number, span: number, count: number) {
  return Array.from({ length: count }, (_, i) => {
    const input = -span + (2 * span * i) / (count - 1);
    return { input, output: Math.sign(input) * Math.max(Math.abs(input) - dead, 0) * gain };
  });
}

/** Harmonic amplitudes of y = x + b·x² + c·x³ driven by a·cos: [DC, H1, H2, H3, 0, …]. */
export function polynomialHarmonics(a: number, b: number, c: number, orders: number): number[] {
  const out = new Array<number>(orders + 1).fill(0);
  out[0] = (b * a * a) / 2;
  out[1] = a + (3 * c * a ** 3) / 4;
  out[2] = (b * a * a) / 2;
  out[3] = (c * a ** 3) / 4;
  return out;
}

/** THD of y = x − k·x³ at peak input a: (k·a³/4) / (a − 3k·a³/4). */
export function cubicThd(k: number, a: number): number {
  return (k * a ** 3 / 4) / (a - (3 * k * a ** 3) / 4);
}

/** A deterministic triangular spread: lo + span·(u_i + u_j)/2 over an n×n grid of midpoints. */
export function triangularSpread(lo: number, span: number, n: number): number[] {
  const values: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) values.push(lo + (span * ((i + 0.5) / n + (j + 0.5) / n)) / 2);
  }
  return values;
}

/** Ideal class-B stage, ±supply into load: output power, dissipation, efficiency by peak. */
export function classBSweep(supply: number, load: number, count: number) {
  return Array.from({ length: count }, (_, i) => {
    const peak = (supply * i) / (count - 1);
    const output = (peak * peak) / (2 * load);
    const drawn = (2 * supply * peak) / (Math.PI * load);
    return {
      level: output,
      dissipation: drawn - output,
      efficiency: drawn > 0 ? output / drawn : 0,
    };
  });
}

/** A resistive load line across one device: I = (supply − V) / load, V from 1 V. */
export function loadLine(supply: number, load: number, count: number) {
  return Array.from({ length: count }, (_, i) => {
    const voltage = 1 + ((supply - 2) * i) / (count - 1);
    return { voltage, current: (supply - voltage) / load };
  });
}

/** CMRR of a resistively loaded long-tailed pair, 20·log10(1 + 2·gm·Rtail), gm = Ic/VT. */
export function cmrrRows(tailCurrents: Record<string, number>, resistances: number[]) {
  return resistances.map((tail) => {
    const row: { tail: number; cmrr: Record<string, number> } = { tail, cmrr: {} };
    for (const [name, current] of Object.entries(tailCurrents)) {
      const gm = current / 2 / VT300;
      row.cmrr[name] = 20 * Math.log10(1 + 2 * gm * tail);
    }
    return row;
  });
}

/** Every chart the snapshot test draws, by snapshot name. */
export function snapshotCharts(): Record<string, Chart> {
  const rs = [1e3, 2e3, 5e3, 1e4, 2e4, 5e4, 1e5, 2e5, 5e5, 1e6];
  return {
    gain_phase: gainPhaseChart(twoPoleResponse(1e5, 100, 20e6, 10, 100e6), {
      title: "Loop gain, two poles",
      gainBandwidth: 10e6,
      minPhaseMargin: 45,
    }),
    transfer_pair: transferCurveChart(pairCurve(2e-3, 0.15, 121), {
      title: "Long-tailed pair, 2 mA tail",
      inputLabel: "Differential input",
      outputLabel: "Differential output current",
      outputUnit: "A",
      maxError: 1e-3,
    }),
    transfer_output_stage: transferCurveChart(deadBandCurve(0.6, 0.98, 10, 201), {
      title: "Class-B follower, 0.6 V dead band",
      inputLabel: "Drive voltage",
      outputLabel: "Output voltage",
      idealGain: 0.98,
      maxError: 0.5,
    }),
    harmonic_spectrum: harmonicSpectrumChart(
      { amplitudes: polynomialHarmonics(1, 0.1, 0.01, 9) },
      { title: "Spectrum of x + 0.1x² + 0.01x³", maxHarmonicDb: -30 },
    ),
    thd_level: thdChart(
      Array.from(
        { length: 40 },
        (_, i) => ({ level: 0.25 * (i + 1), thd: cubicThd(1e-3, 0.25 * (i + 1)) }),
      ),
      { title: "THD of y = x − 0.001x³", maxThd: 0.01 },
    ),
    monte_carlo_histogram: monteCarloChart(triangularSpread(40, 20, 32), {
      title: "CMRR over 1024 trials",
      label: "CMRR",
      unit: "dB",
      requirement: { min: 45 },
      // Grid spacing is 10/32 dB: bins two steps wide avoid aliasing stripes.
      bins: 31,
    }),
    monte_carlo_cumulative: monteCarloChart(triangularSpread(40, 20, 32), {
      title: "CMRR over 1024 trials, cumulative",
      label: "CMRR",
      unit: "dB",
      requirement: { min: 45 },
      kind: "cumulative",
    }),
    dissipation: dissipationChart(classBSweep(20, 8, 41), {
      title: "Ideal class B, ±20 V into 8 Ω",
      maxDissipation: 12,
    }),
    operating_area: operatingAreaChart({
      title: "Output device, 8 Ω load from 40 V",
      boundary: operatingAreaBoundary({ maxVoltage: 100, maxCurrent: 10, maxPower: 60 }),
      load: loadLine(40, 8, 77),
      quiescent: { voltage: 40, current: 0.05 },
    }),
    sweep_single: sweepChart(cmrrRows({ large: 2e-3 }, rs), {
      x: "tail",
      xLabel: "Tail resistance",
      xUnit: "Ω",
      xScale: "log",
      y: "cmrr.large",
      yLabel: "CMRR",
      yUnit: "dB",
      limit: { min: 80 },
    }),
    sweep_series: sweepChart(cmrrRows({ small: 0.5e-3, large: 2e-3 }, rs), {
      x: "tail",
      xLabel: "Tail resistance",
      xUnit: "Ω",
      xScale: "log",
      y: [
        { y: (r) => r.cmrr.small, label: "0.5 mA tail" },
        { y: (r) => r.cmrr.large, label: "2 mA tail" },
      ],
      yLabel: "CMRR",
      yUnit: "dB",
      limit: { min: 80 },
    }),
  };
}
