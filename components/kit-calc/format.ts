import {
  KILOGRAMS_PER_POUND,
  LITRES_PER_GALLON,
  METRES_PER_FOOT,
  METRES_PER_INCH,
  NEWTONS_PER_POUND_FORCE,
  WATTS_PER_HORSEPOWER,
  barFromPsi,
} from "@/server/kit-calc/units";

const formatters = new Map<string, Intl.NumberFormat>();

/** A number for the page, rounded for reading (the API answers unrounded). */
export function fmt(value: number, digits = 1): string {
  const key = String(digits);
  let f = formatters.get(key);
  if (!f) {
    f = new Intl.NumberFormat("en-US", { minimumFractionDigits: digits, maximumFractionDigits: digits });
    formatters.set(key, f);
  }
  return f.format(value);
}

// Metric equivalents shown beside the US figures; every factor is an exact definition (volume: NIST Handbook 44, App. C; pressure and power: NIST SP 811, App. B, from memory).
export const metric = {
  mm: (inches: number) => `${fmt(inches * METRES_PER_INCH * 1000, 0)} mm`,
  m: (feet: number) => `${fmt(feet * METRES_PER_FOOT, 1)} m`,
  mPerS: (feetPerSecond: number) => `${fmt(feetPerSecond * METRES_PER_FOOT, 2)} m/s`,
  litres: (gallons: number) => `${fmt(gallons * LITRES_PER_GALLON, 1)} L`,
  lpm: (gpm: number) => `${fmt(gpm * LITRES_PER_GALLON, 1)} L/min`,
  bar: (psi: number) => `${fmt(barFromPsi(psi), 1)} bar`,
  kW: (hp: number) => `${fmt((hp * WATTS_PER_HORSEPOWER) / 1000, 1)} kW`,
  newtonMetres: (lbFt: number) => `${fmt(lbFt * NEWTONS_PER_POUND_FORCE * METRES_PER_FOOT, 0)} N·m`,
  cc: (cubicInches: number) => `${fmt(cubicInches * (METRES_PER_INCH * 100) ** 3, 1)} cm³/rev`,
  kg: (pounds: number) => `${fmt(pounds * KILOGRAMS_PER_POUND, 0)} kg`,
  squareMetres: (squareFeet: number) => `${fmt(squareFeet * METRES_PER_FOOT ** 2, 2)} m²`,
  kelvinDifference: (fahrenheitDifference: number) => `${fmt((fahrenheitDifference * 5) / 9, 1)} °C difference`,
  watts: (btuPerHour: number, btuPerHourPerHp: number) => `${fmt(((btuPerHour / btuPerHourPerHp) * WATTS_PER_HORSEPOWER) / 1000, 2)} kW`,
};
