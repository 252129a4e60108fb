/**
 * Tick positions and engineering-notation tick labels.
 *
 * Tick labels carry the SI prefix but not the unit ("10k", "2.2µ"); the axis label carries
 * the unit ("Frequency (Hz)"), so the labels stay short.
 *
 * @module
 */
import { formatSi } from "../units/format.ts";

/** A unit that takes SI prefixes, used to ask `formatSi` for the prefix alone. */
const PROBE = "V";
const UNPREFIXED = new Set(["dB", "dBc", "%", "°", "°C", "K/W", "ratio", ""]);

/**
 * Returns a tick formatter for a unit: engineering prefix, no unit, typographic minus.
 *
 * @param unit The axis unit; units that never take prefixes (dB, %, °) print plain numbers.
 * @returns The formatter.
 */
export function siTickFormat(unit: string): (value: number) => string {
  const prefixed = !UNPREFIXED.has(unit);
  return (value: number) => {
    if (!Number.isFinite(value)) return "";
    // Ticks like 0.30000000000000004 come from floating steps: snap before formatting.
    const snapped = Number(value.toPrecision(10));
    const text = prefixed
      ? formatSi(snapped, PROBE, { digits: 3 }).replace(/V$/, "").replace(" ", "")
      : formatSi(snapped, "", { digits: 4 });
    return text.replace(/^-/, "\u2212");
  };
}

/** Axis label with its unit in brackets: `"Frequency (Hz)"`; no brackets when unitless. */
export function axisLabel(label: string, unit: string): string {
  return unit === "" || unit === "ratio" ? label : `${label} (${unit})`;
}

/** Major and minor ticks of a log axis. */
export interface LogTicks {
  /** Every tick position (majors and minors), ascending. */
  ticks: number[];
  /** Tick positions that get a label. */
  labelled: Set<number>;
}

/**
 * Ticks of a log axis between `min` and `max` (both > 0): a labelled tick at each decade
 * and unlabelled ones at 2…9 (only 2 and 5 beyond five decades); over spans shorter than three decades 2 and 5 get labels too,
 * and over spans shorter than one decade every tick does.
 */
export function logTicks(min: number, max: number): LogTicks {
  const lo = Math.floor(Math.log10(min) + 1e-9);
  const hi = Math.ceil(Math.log10(max) - 1e-9);
  const decades = Math.log10(max / min);
  const ticks: number[] = [];
  const labelled = new Set<number>();
  for (let exponent = lo; exponent <= hi; exponent++) {
    for (let step = 1; step <= 9; step++) {
      // Over many decades eight minor ticks a decade are a grey blur: keep 2 and 5 only.
      if (decades > 5 && step !== 1 && step !== 2 && step !== 5) continue;
      const value = Number((step * 10 ** exponent).toPrecision(12));
      if (value < min * (1 - 1e-9) || value > max * (1 + 1e-9)) continue;
      ticks.push(value);
      if (step === 1 || (decades < 3 && (step === 2 || step === 5)) || decades < 1) {
        labelled.add(value);
      }
    }
  }
  return { ticks, labelled };
}

/** Rounds a log-axis domain out to the next 1-2-5 step, so no near-empty decade is added. */
export function logDomain(min: number, max: number): [number, number] {
  const steps = [1, 2, 5, 10];
  const down = (v: number) => {
    const decade = 10 ** Math.floor(Math.log10(v) + 1e-9);
    let best = decade;
    for (const s of steps) if (s * decade <= v * (1 + 1e-9)) best = s * decade;
    return Number(best.toPrecision(12));
  };
  const up = (v: number) => {
    const decade = 10 ** Math.floor(Math.log10(v) - 1e-9);
    for (const s of steps) {
      if (s * decade >= v * (1 - 1e-9)) return Number((s * decade).toPrecision(12));
    }
    return Number((10 * decade).toPrecision(12));
  };
  return [down(min), up(max)];
}
