/**
 * Speed of the output stage's computed transfer curve plus THD at one level (issue 2 target:
 * under 5 ms): 2048 samples, each solved from the device equations, then an FFT.
 */
import { crossoverTransferCurve } from "../../lib/output_stage/mod.ts";

Deno.bench("crossoverTransferCurve() plus THD at 10 V peak (2048 points)", () => {
  const curve = crossoverTransferCurve({ emitterResistance: 0.22, loadResistance: 8 });
  const h = curve.distortion(10);
  if (!(h.thd > 0)) throw new Error("THD must be positive");
});

Deno.bench("crossoverTransferCurve() transfer function only, 2048 samples", () => {
  const curve = crossoverTransferCurve({ emitterResistance: 0.22, loadResistance: 8, points: 2 });
  let sum = 0;
  for (let n = 0; n < 2048; n++) sum += curve.transfer(10 * Math.sin((2 * Math.PI * n) / 2048));
  if (!Number.isFinite(sum)) throw new Error("non-finite output");
});
