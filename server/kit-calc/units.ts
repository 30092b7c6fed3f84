// Exact unit definitions. Everything the calculator converts flows through these constants.

// NIST Handbook 44, Appendix C: 1 US gallon = 231 in³ exactly.
export const CUBIC_INCHES_PER_GALLON = 231;
// NIST Handbook 44, Appendix C: 1 US gallon = 3.785411784 L exactly.
export const LITRES_PER_GALLON = 3.785411784;
// NIST Handbook 44, Appendix C: 1 in = 2.54 cm, 1 ft = 0.3048 m, 1 lb = 0.45359237 kg exactly.
export const METRES_PER_INCH = 0.0254;
export const METRES_PER_FOOT = 0.3048;
export const KILOGRAMS_PER_POUND = 0.45359237;
// NIST SP 811, Appendix B (from memory): standard gravity 9.80665 m/s², which defines the pound-force.
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
export const NEWTONS_PER_POUND_FORCE = KILOGRAMS_PER_POUND * STANDARD_GRAVITY_M_PER_S2;

// NIST SP 811, Appendix B lists 6894.757 Pa (from memory); derived here from the exact pound-force and inch so no rounding creeps in.
export const PASCALS_PER_PSI = NEWTONS_PER_POUND_FORCE / METRES_PER_INCH ** 2;
// NIST SP 811, Appendix B (from memory): 1 bar = 100,000 Pa.
export const PASCALS_PER_BAR = 100_000;
// NIST SP 811, Appendix B (from memory): 1 hp = 550 ft·lbf/s (listed as 745.699872 W, rounded).
export const WATTS_PER_HORSEPOWER = 550 * METRES_PER_FOOT * NEWTONS_PER_POUND_FORCE;
export const FOOT_POUNDS_PER_MINUTE_PER_HORSEPOWER = 33_000;

export const INCHES_PER_FOOT = 12;
export const SQUARE_INCHES_PER_SQUARE_FOOT = 144;
export const SECONDS_PER_MINUTE = 60;

// Fluid-power textbook constant: gpm × psi / 1714 = hp; exact value 12 × 33,000 / 231 = 1714.2857.
export const GPM_PSI_PER_HORSEPOWER = (INCHES_PER_FOOT * FOOT_POUNDS_PER_MINUTE_PER_HORSEPOWER) / CUBIC_INCHES_PER_GALLON;
// Fluid-power textbook constant: lb·ft = hp × 5252 / rpm; exact value 33,000 / (2π) = 5252.11.
export const LB_FT_RPM_PER_HORSEPOWER = FOOT_POUNDS_PER_MINUTE_PER_HORSEPOWER / (2 * Math.PI);
// Trade reference: 1 hp = 2544 Btu/h (rounded; the International Table Btu gives 2544.43, a 0.02 % difference).
export const BTU_PER_HOUR_PER_HORSEPOWER = 2544;
// Fluid-power textbook metric form: kW = L/min × bar / 600 exactly (10⁵ Pa × 10⁻³ m³ / 60 s = 5/3 W).
export const LPM_BAR_PER_KILOWATT = 600;

// NIST Handbook 44, Appendix C: 231 in³ per gallon.
export const gallonsFromCubicInches = (cubicInches: number): number => cubicInches / CUBIC_INCHES_PER_GALLON;
// NIST Handbook 44, Appendix C: 3.785411784 L per gallon.
export const litresFromGallons = (gallons: number): number => gallons * LITRES_PER_GALLON;
// NIST SP 811, Appendix B (from memory): psi → Pa, then 10⁵ Pa per bar.
export const barFromPsi = (psi: number): number => (psi * PASCALS_PER_PSI) / PASCALS_PER_BAR;
// NIST Handbook 44, Appendix C: 144 in² per ft².
export const squareFeetFromSquareInches = (squareInches: number): number => squareInches / SQUARE_INCHES_PER_SQUARE_FOOT;

// NIST SP 811, Appendix B (from memory): the conventional millimetre of mercury is 133.322387415 Pa (mercury at
// 13.5951 g/cm³ under standard gravity), so an inch of mercury is 25.4 times that, 3386.389 Pa.
export const PASCALS_PER_IN_HG = 25.4 * 133.322387415;
// 1 cSt = 1 mm²/s = 10⁻⁶ m²/s by definition of the stokes (1 St = 1 cm²/s).
export const SQUARE_METRES_PER_SECOND_PER_CST = 1e-6;
export const CUBIC_METRES_PER_GALLON = LITRES_PER_GALLON / 1000;
