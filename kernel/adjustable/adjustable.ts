/**
 * Adjustable values: a cell declares a value a designer may want to turn, with its
 * default, unit, range and step. Run as it is, the value is the default; the kernel can
 * set another (`longtail run design.md --set tailCurrent=2m`), and a live page can show a
 * control for it.
 *
 *     import { adjustable } from "longtail/notebook";
 *     const tailCurrent = adjustable(2e-3, { unit: "A", min: 0.5e-3, max: 5e-3, step: 0.1e-3 });
 *
 * The kernel learns the name from the declaration (`const tailCurrent = …`) and compiles
 * the call as `adjustable.named("tailCurrent")(…)`. The two sides meet through a registry
 * under `Symbol.for("longtail.adjustables")` on `globalThis`, set by the sandbox; outside
 * the kernel there is no registry and the default is used.
 *
 * @module
 */

/** Options for {@linkcode adjustable}. */
export interface AdjustableOptions {
  /**
   * Unit symbol, e.g. `"A"`, `"Ω"`.
   * @default {""}
   */
  unit?: string;
  /**
   * Smallest allowed value.
   * @default {-Infinity}
   */
  min?: number;
  /**
   * Largest allowed value.
   * @default {Infinity}
   */
  max?: number;
  /**
   * Step between values a control offers (0: any value).
   * @default {0}
   */
  step?: number;
  /**
   * Words shown beside a control.
   * @default {the declared name}
   */
  label?: string;
}

/** An adjustable value as declared, and the value it took. */
export interface AdjustableDeclaration {
  /** The name it is bound to (empty when unknown). */
  name: string;
  /** The default. */
  defaultValue: number;
  /** The value used (the default, or the value set from outside). */
  value: number;
  /** Unit symbol. */
  unit: string;
  /** Smallest allowed value. */
  min: number;
  /** Largest allowed value. */
  max: number;
  /** Step (0: any). */
  step: number;
  /** Label for a control. */
  label: string;
}

/** The registry the sandbox installs: values set from outside, declarations seen. */
export interface AdjustableRegistry {
  /** Values set from outside, by name. */
  values: Record<string, number>;
  /** Declarations in the order they ran. */
  declared: AdjustableDeclaration[];
}

/** The well-known symbol under which the sandbox installs the registry on `globalThis`. */
export const ADJUSTABLE_REGISTRY: unique symbol = Symbol.for("longtail.adjustables") as never;

/** The helper's call signature, plus `named` for the kernel. */
export interface Adjustable {
  /**
   * Declares an adjustable value and returns the value to use.
   *
   * @param defaultValue The value used unless another is set.
   * @param options Unit, range, step, label.
   * @returns The default, or the value set from outside.
   * @throws {RangeError} If the default or the set value is not finite or outside the range.
   */
  (defaultValue: number, options?: AdjustableOptions): number;
  /**
   * The same helper, knowing the name it is bound to (used by compiled cells).
   *
   * @param name The declared name.
   * @returns The helper for that name.
   */
  named(name: string): (defaultValue: number, options?: AdjustableOptions) => number;
}

function declare(name: string, defaultValue: number, options: AdjustableOptions = {}): number {
  const unit = options.unit ?? "";
  const min = options.min ?? -Infinity;
  const max = options.max ?? Infinity;
  const step = options.step ?? 0;
  const what = name || "the adjustable value";
  const show = (x: number) => `${x}${unit ? " " + unit : ""}`;
  if (!(min <= max)) {
    throw new RangeError(
      `Expected min of ${what} to be at most max (${show(max)}), but found ${show(min)}`,
    );
  }
  if (!(step >= 0)) {
    throw new RangeError(`Expected step of ${what} to be at least 0, but found ${step}`);
  }
  const check = (value: number, subject: string) => {
    if (!Number.isFinite(value) || value < min || value > max) {
      throw new RangeError(
        `Expected ${subject} to be a finite number within ${show(min)} … ${show(max)}, but found ${
          show(value)
        }`,
      );
    }
  };
  check(defaultValue, `the default of ${what}`);
  const registry =
    (globalThis as Record<symbol, AdjustableRegistry | undefined>)[ADJUSTABLE_REGISTRY];
  const set = name && registry && Object.hasOwn(registry.values, name)
    ? registry.values[name]
    : undefined;
  const value = set ?? defaultValue;
  if (set !== undefined) check(set, `the value set for ${what}`);
  registry?.declared.push({
    name,
    defaultValue,
    value,
    unit,
    min,
    max,
    step,
    label: options.label ?? name,
  });
  return value;
}

/**
 * Declares an adjustable value: default, unit, range and step.
 *
 * @example The default is used when nothing else is set
 * ```ts
 * import { adjustable } from "./adjustable.ts";
 * import { equal, throws } from "node:assert/strict";
 * const tailCurrent = adjustable(2e-3, { unit: "A", min: 0.5e-3, max: 5e-3, step: 0.1e-3 });
 * equal(tailCurrent, 2e-3);
 * throws(() => adjustable(9, { min: 0, max: 5 }), RangeError);
 * ```
 */
export const adjustable: Adjustable = Object.assign(
  (defaultValue: number, options?: AdjustableOptions) => declare("", defaultValue, options),
  {
    named: (name: string) => (defaultValue: number, options?: AdjustableOptions) =>
      declare(name, defaultValue, options),
  },
);
