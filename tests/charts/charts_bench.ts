import { chartDocument, gainPhaseChart, sweepChart } from "longtail/charts";
import { twoPoleResponse } from "./_fixtures.ts";

// Target (issue 4): a chart of 1,000 points renders in under 10 ms once the document exists.
const document = await chartDocument();
const response = twoPoleResponse(1e5, 100, 20e6, 10, 1e10, 111).slice(0, 1000);
const rows = Array.from({ length: 1000 }, (_, i) => ({ x: i * 1e-3, y: Math.sin(i / 40) }));

Deno.bench("sweepChart() of 1,000 points to SVG (linear axes)", () => {
  sweepChart(rows, { x: "x", y: "y", xUnit: "V", yUnit: "A" }).toSvg({ document });
});

Deno.bench("gainPhaseChart() of 1,000 points to SVG (two log-frequency panels)", () => {
  gainPhaseChart(response, { minPhaseMargin: 45 }).toSvg({ document });
});
