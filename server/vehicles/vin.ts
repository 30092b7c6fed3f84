// VIN check digit: 49 CFR Part 565 (ISO 3779 characters) — position 9 is the weighted sum of
// the transliterated characters, mod 11, with 10 written as "X".
const TRANSLITERATION: Record<string, number> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
};
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];

export const VIN_PATTERN = /^[A-HJ-NPR-Z0-9]{17}$/;

function value(ch: string): number {
  if (ch >= "0" && ch <= "9") return Number(ch);
  const v = TRANSLITERATION[ch];
  if (v === undefined) throw new Error(`VIN character ${ch} is not allowed`);
  return v;
}

export function vinCheckDigit(vin: string): string {
  let sum = 0;
  for (let i = 0; i < 17; i++) sum += value(vin[i]) * WEIGHTS[i];
  const r = sum % 11;
  return r === 10 ? "X" : String(r);
}

// 49 CFR 565.15 (from memory): the 10th character is the model year, from a table that leaves out
// I, O and Q (as every position does) and also U, Z and the digit 0.
export const MODEL_YEAR_PATTERN = /^[A-HJ-NPR-TV-Y1-9]$/;

export type VinProblem = "length" | "characters" | "model_year" | "check_digit";

export function vinProblem(raw: string): VinProblem | null {
  const vin = raw.trim().toUpperCase();
  if (vin.length !== 17) return "length";
  if (!VIN_PATTERN.test(vin)) return "characters";
  if (!MODEL_YEAR_PATTERN.test(vin[9])) return "model_year";
  return vinCheckDigit(vin) === vin[8] ? null : "check_digit";
}

export const VIN_MESSAGES: Record<VinProblem, string> = {
  length: "A VIN has 17 characters.",
  characters: "A VIN uses digits and capital letters except I, O and Q.",
  model_year: "The 10th character (model year) cannot be U, Z or 0; re-read the VIN from the door pillar or title.",
  check_digit: "The 9th character (check digit) does not match the rest; re-read the VIN from the door pillar or title.",
};

/** Puts the right check digit in position 9 of a 17-character VIN. */
export function withCheckDigit(vin: string): string {
  const upper = vin.toUpperCase();
  return upper.slice(0, 8) + vinCheckDigit(upper) + upper.slice(9);
}
