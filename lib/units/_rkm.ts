/**
 * The RKM reader shared by `parseRkm` and `parseQuantity` (private to `units/`).
 *
 * @module
 */

/** Multiplier letters of resistor codes (ohms), as powers of ten. */
export const RESISTOR_LETTERS: ReadonlyMap<string, number> = new Map([
  ["R", 0],
  ["K", 3],
  ["k", 3],
  ["M", 6],
  ["G", 9],
  ["T", 12],
]);

/** Multiplier letters of capacitor codes (farads), as powers of ten. */
export const CAPACITOR_LETTERS: ReadonlyMap<string, number> = new Map([
  ["p", -12],
  ["n", -9],
  ["u", -6],
  ["µ", -6],
  ["μ", -6],
  ["m", -3],
]);

/** IEC 60062 tolerance letters as fractions (J = ±5 % = 0.05). */
export const TOLERANCE_LETTERS: ReadonlyMap<string, number> = new Map([
  ["B", 0.001],
  ["C", 0.0025],
  ["D", 0.005],
  ["F", 0.01],
  ["G", 0.02],
  ["J", 0.05],
  ["K", 0.1],
  ["M", 0.2],
]);

//   4 K 7 J      integer digits, multiplier letter, fraction digits,
//   │ │ │ └─ tolerance letter (optional)
//   │ │ └─── digits after the decimal point the letter stands for
//   │ └───── multiplier letter: R K M G T (Ω) or p n µ u m (F)
//   └─────── digits before it (none in "R47")
const PATTERN = /^(\d*)([RKkMGTpnuµμm])(\d*)(F?)([BCDFGJKM]?)$/u;

/** What the RKM reader found. */
export interface RkmReading {
  /** The value in SI base units. */
  value: number;
  /** "Ω" or "F", from the multiplier letter. */
  unit: string;
  /** Tolerance as a fraction, when a letter gave one. */
  tolerance: number | undefined;
  /** True unless SI notation reads the same text the same way ("10k", "100n"). */
  distinctive: boolean;
  /** True when the text spelled the unit F out ("4n7F"). */
  unitWritten: boolean;
}

/**
 * Reads `body` (no sign, no surrounding space) as an RKM code, or returns `undefined` when it
 * does not have the shape of one.
 */
export function readRkm(body: string): RkmReading | undefined {
  const match = PATTERN.exec(body);
  if (match === null) return undefined;
  const [, whole, letter, fraction, farad, toleranceLetter] = match;
  if (whole === "" && fraction === "") return undefined;
  const resistor = RESISTOR_LETTERS.get(letter);
  let toleranceKey = toleranceLetter;
  let unitWritten = false;
  if (farad === "F") {
    if (resistor !== undefined) {
      // After a resistor letter a trailing F can only be the ±1 % tolerance letter.
      if (toleranceLetter !== "") return undefined;
      toleranceKey = "F";
    } else {
      unitWritten = true;
    }
  }
  const exponent = resistor ?? CAPACITOR_LETTERS.get(letter)!;
  return {
    // Decimal text through Number() rounds once, so "2p2" is exactly the double 2.2e-12.
    value: Number(`${whole === "" ? "0" : whole}.${fraction}e${exponent}`),
    unit: resistor === undefined ? "F" : "Ω",
    tolerance: toleranceKey === "" ? undefined : TOLERANCE_LETTERS.get(toleranceKey),
    distinctive: (whole !== "" && fraction !== "") || whole === "" || letter === "R" ||
      toleranceKey !== "",
    unitWritten,
  };
}
