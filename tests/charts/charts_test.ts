import fc from "fast-check";
import { assert, assertClose, assertEquals, assertThrows } from "../_assert.ts";
import {
  CHART_PALETTE,
  CHART_SERIES,
  chartDocument,
  gainPhaseChart,
  harmonicSpectrumChart,
  monteCarloChart,
  sweepChart,
  transferCurveChart,
} from "longtail/charts";
import { DISPLAY } from "longtail/lib/display.ts";
import { logTicks, siTickFormat } from "longtail/lib/charts/_ticks.ts";
import { cubicThd, snapshotCharts, twoPoleResponse, VT300 } from "./_fixtures.ts";
import { assertSnapshot } from "./_snapshot.ts";

const PREFIX: Record<string, number> = {
  T: 1e12,
  G: 1e9,
  M: 1e6,
  k: 1e3,
  "": 1,
  m: 1e-3,
  "µ": 1e-6,
  n: 1e-9,
  p: 1e-12,
};

/** Reads the first `<number> <prefix><unit>` after `after` in a description. */
function readSi(text: string, after: string, unit: string): number {
  const pattern = new RegExp(
    `${after}\\s*([−-]?[\\d.]+)\\s?(T|G|M|k|m|µ|n|p)?${unit.replace(/[%°]/, "\\$&")}`,
  );
  const match = text.match(pattern);
  assert(match, `no "${after} … ${unit}" in: ${text}`);
  return Number(match[1].replace("−", "-")) * PREFIX[match[2] ?? ""];
}

const charts = snapshotCharts();
const document = await chartDocument();
const svgs = Object.fromEntries(
  Object.entries(charts).map(([name, chart]) => [name, chart.toSvg({ document })]),
);

for (const name of Object.keys(charts)) {
  Deno.test(`${name} chart matches its committed SVG snapshot`, async () => {
    await assertSnapshot(name, svgs[name]);
  });
}

const LABELS: Record<string, string[]> = {
  gain_phase: ["Frequency (Hz)", "Gain (dB)", "Phase (°)"],
  transfer_pair: [
    "Differential input (V)",
    "Differential output current (A)",
    "Error from ideal (A)",
  ],
  transfer_output_stage: ["Drive voltage (V)", "Output voltage (V)", "Error from ideal (V)"],
  harmonic_spectrum: ["Harmonic number", "Level relative to fundamental (dBc)"],
  thd_level: ["Output level, peak (V)", "THD (%)"],
  monte_carlo_histogram: ["CMRR (dB)", "Trials"],
  monte_carlo_cumulative: ["CMRR (dB)", "Trials at or below (%)"],
  dissipation: ["Output power (W)", "Dissipation (W)", "Efficiency (%)"],
  operating_area: ["Voltage across device (V)", "Device current (A)"],
  sweep_single: ["Tail resistance (Ω)", "CMRR (dB)"],
  sweep_series: ["Tail resistance (Ω)", "CMRR (dB)", "0.5 mA tail", "2 mA tail"],
};

Deno.test("every chart labels its axes with their units", () => {
  for (const [name, labels] of Object.entries(LABELS)) {
    for (const label of labels) assert(svgs[name].includes(`>${label}<`), `${name}: ${label}`);
  }
});

Deno.test("every chart with a requirement draws a dashed line in the limit colour", () => {
  for (const [name, svg] of Object.entries(svgs)) {
    const dashedLimit = new RegExp(
      `stroke="${CHART_PALETTE.limit}"[^>]*stroke-dasharray="6,3"|stroke-dasharray="6,3"[^>]*stroke="${CHART_PALETTE.limit}"`,
    );
    // The operating area's limit is the solid boundary of the shaded area instead.
    if (name === "operating_area") assert(svg.includes(`stroke="${CHART_PALETTE.limit}"`));
    else assert(dashedLimit.test(svg), `${name} has no dashed limit line`);
  }
});

Deno.test("rendering is deterministic, and two charts never share an element id", () => {
  const again = charts.gain_phase.toSvg({ document });
  assertEquals(again, svgs.gain_phase);
  const ids = (svg: string) => new Set([...svg.matchAll(/\sid="([^"]+)"/g)].map((m) => m[1]));
  const a = ids(svgs.gain_phase);
  const b = ids(svgs.transfer_pair);
  assert(a.size > 0 && b.size > 0, "both charts clip a mark");
  for (const id of a) assert(!b.has(id), `shared id ${id}`);
});

Deno.test("a chart displays itself as SVG plus its description", async () => {
  const bundle = await charts.sweep_single[DISPLAY]();
  assert(bundle["image/svg+xml"].startsWith('<svg xmlns="http://www.w3.org/2000/svg"'));
  assertEquals(bundle["text/plain"], charts.sweep_single.description);
});

Deno.test("chart modules never import jsdom statically (it loads on first display only)", async () => {
  for await (const entry of Deno.readDir(new URL("../../lib/charts/", import.meta.url))) {
    const text = await Deno.readTextFile(
      new URL(`../../lib/charts/${entry.name}`, import.meta.url),
    );
    assert(!/^import[^;]*from "jsdom"/m.test(text), entry.name);
  }
});

Deno.test("gainPhaseChart() finds the single-pole crossover and its 90° phase margin", () => {
  // A0 = 1000, pole 1 kHz: |T| = 1 at f = fp·√(A0² − 1); margin = 180° − atan(√(A0² − 1)).
  const chart = gainPhaseChart(twoPoleResponse(1000, 1e3, 1e15, 10, 1e8, 40));
  const fc = 1e3 * Math.sqrt(1e6 - 1);
  assertClose(readSi(chart.description, "crossover", "Hz"), fc, { rtol: 5e-3 }); // closed form, 3 digits shown
  const margin = 180 - Math.atan(Math.sqrt(1e6 - 1)) * 180 / Math.PI;
  assertClose(readSi(chart.description, "phase margin", "°"), margin, { rtol: 1e-3 }); // closed form
});

Deno.test("gainPhaseChart() matches the two-pole phase margin solved from |T(fc)| = 1", () => {
  // |T| = 1e5 / √((1 + (f/100)²)(1 + (f/20e6)²)); solve by bisection in log f.
  const magnitude = (f: number) => 1e5 / Math.sqrt((1 + (f / 100) ** 2) * (1 + (f / 20e6) ** 2));
  let [lo, hi] = [1e3, 1e9];
  for (let i = 0; i < 100; i++) {
    const mid = Math.sqrt(lo * hi);
    if (magnitude(mid) > 1) lo = mid;
    else hi = mid;
  }
  const margin = 180 - (Math.atan(lo / 100) + Math.atan(lo / 20e6)) * 180 / Math.PI;
  const text = charts.gain_phase.description;
  assertClose(readSi(text, "crossover", "Hz"), lo, { rtol: 6e-3 }); // closed form + bisection, 3 digits shown
  assertClose(readSi(text, "phase margin", "°"), margin, { rtol: 2e-3 }); // closed form, 20 points/decade
});

Deno.test("transferCurveChart() reports the tanh pair's worst error at the ends of the sweep", () => {
  // Error at ±150 mV: Iee·tanh(0.15/2VT) − (Iee/2VT)·0.15, slope from samples 2.5 mV apart.
  const slope = 2e-3 * Math.tanh(0.0025 / (2 * VT300)) / 0.0025;
  const expected = Math.abs(2e-3 * Math.tanh(0.15 / (2 * VT300)) - slope * 0.15);
  assertClose(readSi(charts.transfer_pair.description, "worst error", "A"), expected, {
    rtol: 2e-3,
  }); // closed form
});

Deno.test("harmonicSpectrumChart() puts H2 of x + 0.1x² + 0.01x³ at −26.1 dBc", () => {
  // H2 = b/2 = 0.05, H1 = 1 + 3c/4 = 1.0075, H3 = c/4 = 0.0025 (Kreyszig10 ch. 11, cos² and cos³ identities).
  const text = charts.harmonic_spectrum.description;
  assertClose(readSi(text, "H2", "dBc"), 20 * Math.log10(0.05 / 1.0075), { atol: 0.05 }); // closed form, 3 digits
  assertClose(readSi(text, "THD", "%"), 100 * Math.hypot(0.05, 0.0025) / 1.0075, { rtol: 2e-3 }); // closed form
});

Deno.test("thdChart() finds where the cubic's THD reaches 1 %", () => {
  // (k a²/4) / (1 − 3k a²/4) = 0.01  ⇒  a = √(0.01 / (k (1/4 + 0.0075))), k = 0.001.
  const expected = Math.sqrt(0.01 / (1e-3 * (0.25 + 0.0075)));
  assertClose(cubicThd(1e-3, expected), 0.01, { rtol: 1e-9 }); // closed form, self-consistency
  assertClose(readSi(charts.thd_level.description, "limit at", "V"), expected, { rtol: 3e-3 }); // closed form, 0.25 V steps
});

Deno.test("monteCarloChart() yield matches the triangular spread's passing fraction", () => {
  // P(u1 + u2 ≥ 0.5) = 1 − 0.5²/2 = 0.875 for independent uniforms; the 32×32 grid is within 1 %.
  assertClose(readSi(charts.monte_carlo_histogram.description, "yield", "%") / 100, 0.875, {
    atol: 0.01,
  }); // closed form
  const small = monteCarloChart([38, 41, 45, 52], {
    unit: "dB",
    requirement: { min: 40, max: 50 },
  });
  assert(small.description.includes("yield 50% (2 of 4)")); // closed form: 41 and 45 pass
});

Deno.test("dissipationChart() marks the class-B worst case 2·Vs²/(π²·R)", () => {
  const expected = 2 * 20 ** 2 / (Math.PI ** 2 * 8);
  assertClose(readSi(charts.dissipation.description, "worst case", "W"), expected, { rtol: 5e-3 }); // SS7 ch. 12 (from memory), closed form; 3 digits shown
  assertClose(readSi(charts.dissipation.description, "W at", "W"), expected, { rtol: 0.04 }); // closed form, 0.5 V peak steps
});

Deno.test("operatingAreaChart() finds the load line's closest approach to the power limit", () => {
  // I = (40 − V)/8 against 60 W / V: ratio (40 − V)·V / 480, largest at V = 20 V: 400/480.
  assertClose(readSi(charts.operating_area.description, "comes to", "%") / 100, 400 / 480, {
    rtol: 2e-3,
  }); // closed form
  assertClose(readSi(charts.operating_area.description, "current at", "V"), 20, { rtol: 1e-9 }); // closed form
});

Deno.test("sweepChart() reads nested fields and spans the closed-form CMRR range", () => {
  // CMRR = 20·log10(1 + 2·gm·R), gm = 1 mA / VT (GHLM5 ch. 3, from memory).
  const gm = 1e-3 / VT300;
  const text = charts.sweep_single.description;
  assertClose(readSi(text, ":", "dB"), 20 * Math.log10(1 + 2 * gm * 1e3), { atol: 0.05 }); // closed form
  assertClose(readSi(text, "…", "dB"), 20 * Math.log10(1 + 2 * gm * 1e6), { atol: 0.05 }); // closed form
});

Deno.test("chart helpers reject empty or non-physical data with a message naming the value", () => {
  assertThrows(() => gainPhaseChart([]), {
    name: "TypeError",
    message: "Expected points to hold at least 2 points, but found 0 points",
  });
  assertThrows(
    () =>
      gainPhaseChart([{ frequency: -1, gainDb: 0, phaseDeg: 0 }, {
        frequency: 1,
        gainDb: 0,
        phaseDeg: 0,
      }]),
    {
      name: "RangeError",
      message: "Expected points[0].frequency to be greater than 0 Hz, but found -1",
    },
  );
  assertThrows(
    () =>
      transferCurveChart([{ input: 0, output: 0 }, { input: 1, output: 1 }, {
        input: 2,
        output: NaN,
      }]),
    TypeError,
  );
  assertThrows(() => harmonicSpectrumChart({ amplitudes: [0, 0, 0.1] }), RangeError);
  assertThrows(() => monteCarloChart([1, 2, 3], { requirement: { min: 2, max: 1 } }), RangeError);
});

/** CIE 1976 L* of an sRGB hex colour. */
function lightness(hex: string): number {
  const linear = [1, 3, 5].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  const y = 0.2126 * linear[0] + 0.7152 * linear[1] + 0.0722 * linear[2];
  return y > 216 / 24389 ? 116 * Math.cbrt(y) - 16 : (24389 / 27) * y;
}

Deno.test("palette neighbours differ in lightness, so they survive grey-scale print", () => {
  // CIE 1976 L* from sRGB (closed form); 15 L* apart is our own readability margin (common practice, no source).
  for (let i = 1; i < CHART_SERIES.length; i++) {
    assert(
      Math.abs(lightness(CHART_SERIES[i]) - lightness(CHART_SERIES[i - 1])) >= 15,
      `series ${i}`,
    );
  }
  assert(lightness(CHART_PALETTE.failFill) - lightness(CHART_PALETTE.passFill) >= 15);
  assertClose(lightness("#ffffff"), 100, { rtol: 1e-9 }); // closed form: white is L* = 100
});

Deno.test("tick labels read back as the value they mark, to 3 significant digits", () => {
  const format = siTickFormat("Hz");
  fc.assert(
    fc.property(
      fc.double({ min: -12, max: 12, noNaN: true }),
      fc.boolean(),
      (exponent, negative) => {
        const value = (negative ? -1 : 1) * 10 ** exponent;
        const match = format(value).match(/^(−?[\d.]+)(T|G|M|k|m|µ|n|p)?$/);
        assert(match, format(value));
        const back = Number(match[1].replace("−", "-")) * PREFIX[match[2] ?? ""];
        assertClose(back, value, { rtol: 5e-3 }); // closed form: 3 significant digits
      },
    ),
    { numRuns: 300 },
  );
});

Deno.test("log ticks ascend, stay inside the domain and label every decade", () => {
  fc.assert(
    fc.property(
      fc.double({ min: -9, max: 9, noNaN: true }),
      fc.double({ min: 0.3, max: 8, noNaN: true }),
      (start, span) => {
        const [lo, hi] = [10 ** start, 10 ** (start + span)];
        const { ticks, labelled } = logTicks(lo, hi);
        for (let i = 1; i < ticks.length; i++) assert(ticks[i] > ticks[i - 1]);
        for (const t of ticks) assert(t >= lo * (1 - 1e-9) && t <= hi * (1 + 1e-9));
        for (let e = Math.ceil(start); e <= start + span; e++) {
          if (10 ** e >= lo && 10 ** e <= hi) {
            assert(labelled.has(Number((10 ** e).toPrecision(12))));
          }
        }
      },
    ),
    { numRuns: 200 },
  );
});

Deno.test("monteCarloChart() never rounds a yield with failures up to 100 %", () => {
  // 19 997 of 20 000 pass: 99.985 %, which three digits would print as "100%".
  const values = Array.from({ length: 20_000 }, (_, i) => (i < 3 ? 1 : 10));
  const chart = monteCarloChart(values, { requirement: { min: 5 } });
  assert(chart.description.includes("yield 99.98% (19997 of 20000)"), chart.description);
  // One failure in 200 000 needs six digits.
  const tiny = monteCarloChart(Array.from({ length: 200_000 }, (_, i) => (i === 0 ? 1 : 10)), {
    requirement: { min: 5 },
  });
  assert(tiny.description.includes("yield 99.999% (199999 of 200000)"), tiny.description);
  const all = monteCarloChart([10, 11, 12], { requirement: { min: 5 } });
  assert(all.description.includes("yield 100% (3 of 3)"), all.description);
});

Deno.test("harmonicSpectrumChart() labels harmonics under the floor '< floor', not −318 dBc", () => {
  const chart = harmonicSpectrumChart({ amplitudes: [0, 1, 1e-16, 1e-3, 0] }, { floorDb: -120 });
  assert(chart.description.includes("H2 < −120 dBc"), chart.description);
  assert(chart.description.includes("H3 −60 dBc"), chart.description); // closed form 20·log10(1e-3)
  const svg = chart.toSvg({ document });
  assert(!/−3\d\d/.test(svg), "no absurd level printed");
  assertEquals(svg.match(/&lt; −120/g)?.length, 2); // H2 and the zero H4 sit on the floor
});

Deno.test("sweepChart() moves apart series labels whose lines end close together", () => {
  const rows = [1, 2, 3, 4].map((x) => ({ x, a: 10 + x, b: 10.05 + x, c: 10.1 + x, d: 0 }));
  const chart = sweepChart(rows, {
    x: "x",
    y: [
      { y: "a", label: "first" },
      { y: "b", label: "second" },
      { y: "c", label: "third" },
      { y: "d", label: "flat" },
    ],
  });
  const svg = chart.toSvg({ document });
  const label =
    /<g [^>]*font-weight="bold" transform="translate\([\d.]+,(-?[\d.]+)\)"><text [^>]*transform="translate\([\d.]+,([\d.]+)\)">(\w+)<\/text>/g;
  const ys = new Map<string, number>();
  for (const m of svg.matchAll(label)) ys.set(m[3], Number(m[1]) + Number(m[2]));
  assertEquals([...ys.keys()].sort(), ["first", "flat", "second", "third"]);
  const crowded = ["first", "second", "third"].map((n) => ys.get(n)!).sort((p, q) => p - q);
  assert(crowded[1] - crowded[0] >= 12 && crowded[2] - crowded[1] >= 12, `${crowded}`); // 11 px text
  // A label with room keeps its place at the end of its line.
  assert(svg.includes('transform="translate(8,0)"><text y="0.32em" transform="translate('));
});
