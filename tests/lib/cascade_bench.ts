/**
 * Speed target (issue 2): a 1,000-point frequency sweep of a three-stage cascade with
 * feedback, under 2 ms.
 */
import {
  cascade,
  feedbackLoop,
  logFrequencies,
  rcParallelImpedance,
} from "../../lib/cascade/mod.ts";
import type { TwoPort } from "../../lib/cascade/mod.ts";
import { commonEmitterStage } from "../../lib/voltage_stage/mod.ts";

const inputPair: TwoPort = {
  name: "input pair",
  inputResistance: 200e3,
  openCircuitGain: 50,
  outputResistance: 50e3,
  at: (f) => {
    const x = f / 2e6;
    const d = 1 + x * x;
    return {
      inputImpedance: rcParallelImpedance(200e3, 10e-12, f),
      openCircuitGain: { re: 50 / d, im: (-50 * x) / d },
      outputImpedance: { re: 50e3, im: 0 },
    };
  },
};
const vas = commonEmitterStage({
  collectorCurrent: 5e-3,
  beta: 150,
  earlyVoltage: 80,
  collectorResistance: 50e3,
  loadResistance: 200e3,
  emitterFollower: { collectorCurrent: 1e-3, emitterResistance: 10e3 },
  collectorBaseCapacitance: 100e-12,
  baseEmitterCapacitance: 20e-12,
  outputCapacitance: 50e-12,
});
const outputStage: TwoPort = {
  name: "output stage",
  inputResistance: 200e3,
  openCircuitGain: 0.97,
  outputResistance: 0.3,
};
const chain = cascade({
  stages: [inputPair, vas.twoPort, outputStage],
  sourceResistance: 600,
  loadResistance: 8,
  loadCapacitance: 10e-9,
});
// The VAS inverts, so the feedback factor carries the sign that makes the loop negative.
const frequencies = logFrequencies(1, 100e6, { points: 1000 });

Deno.bench("cascade(): 1,000-point sweep of three stages, open loop", () => {
  chain.sweep(frequencies);
});

Deno.bench("feedbackLoop(): 1,000-point closed-loop sweep of three stages (target < 2 ms)", () => {
  const loop = feedbackLoop(chain.gainAt, { feedbackFactor: -1 / 21 });
  loop.sweep(frequencies);
});

Deno.bench("feedbackLoop(): margins and bandwidth only", () => {
  feedbackLoop(chain.gainAt, { feedbackFactor: -1 / 21 });
});
