import { evaluate, unit } from "mathjs";
import { describe, expect, it } from "vitest";
import { OIL_POUNDS_PER_GALLON } from "@/server/kit-calc/practice";
import {
  BTU_PER_HOUR_PER_HORSEPOWER,
  CUBIC_INCHES_PER_GALLON,
  GPM_PSI_PER_HORSEPOWER,
  LB_FT_RPM_PER_HORSEPOWER,
  LITRES_PER_GALLON,
  LPM_BAR_PER_KILOWATT,
  PASCALS_PER_PSI,
  WATTS_PER_HORSEPOWER,
  barFromPsi,
  gallonsFromCubicInches,
  litresFromGallons,
  squareFeetFromSquareInches,
} from "@/server/kit-calc/units";

// mathjs units are an independent oracle built from SI definitions; its float arithmetic agrees with exact
// values to about 1e-10, so oracle comparisons use a relative tolerance of 1e-9.
const ORACLE_RELATIVE = 1e-9;
const expectRelative = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative);

describe("exact units (volume and length: NIST Handbook 44, Appendix C; pressure and power: NIST SP 811, Appendix B)", () => {
  it("1 US gallon is 231 in³ exactly (NIST HB 44 App. C), and mathjs agrees", () => {
    expectRelative(CUBIC_INCHES_PER_GALLON, unit(1, "gallon").toNumber("cuin"), ORACLE_RELATIVE);
  });

  it("1 US gallon is 3.785411784 L exactly (NIST HB 44 App. C): 231 × 2.54³ cm³, and mathjs agrees", () => {
    expectRelative(LITRES_PER_GALLON, (231 * 2.54 ** 3) / 1000, 1e-15);
    expectRelative(LITRES_PER_GALLON, unit(1, "gallon").toNumber("L"), ORACLE_RELATIVE);
  });

  it("1 psi is 6894.757 Pa (NIST SP 811, App. B, from memory, to 0.001 Pa, so ±0.0005 Pa), and mathjs agrees", () => {
    expect(Math.abs(PASCALS_PER_PSI - 6894.757)).toBeLessThanOrEqual(0.0005);
    expectRelative(PASCALS_PER_PSI, unit(1, "psi").toNumber("Pa"), ORACLE_RELATIVE);
  });

  it("1 hp is 745.699872 W (NIST SP 811, App. B, from memory, to 1e-6 W, so ±5e-7 W), and mathjs agrees", () => {
    expect(Math.abs(WATTS_PER_HORSEPOWER - 745.699872)).toBeLessThanOrEqual(5e-7);
    expectRelative(WATTS_PER_HORSEPOWER, unit(1, "hp").toNumber("W"), ORACLE_RELATIVE);
  });

  it("1 bar is 100,000 Pa (NIST SP 811, App. B, from memory): psi → bar matches mathjs across the pressure range", () => {
    for (const psi of [1, 14.696, 500, 2500, 3000, 10_000]) {
      expectRelative(barFromPsi(psi), unit(psi, "psi").toNumber("bar"), ORACLE_RELATIVE);
    }
  });

  it("gallons ↔ in³ ↔ litres match mathjs (NIST HB 44 App. C definitions)", () => {
    for (const cubicInches of [1, 231, 9424.78, 1_000_000]) {
      expectRelative(gallonsFromCubicInches(cubicInches), unit(cubicInches, "cuin").toNumber("gallon"), ORACLE_RELATIVE);
    }
    for (const gallons of [1, 42.3, 500]) {
      expectRelative(litresFromGallons(gallons), unit(gallons, "gallon").toNumber("L"), ORACLE_RELATIVE);
    }
    expectRelative(squareFeetFromSquareInches(288), unit(288, "inch^2").toNumber("ft^2"), ORACLE_RELATIVE);
  });
});

describe("fluid-power constants against their rounded published forms", () => {
  it("gpm × psi per hp is 1714.2857 (12 × 33,000 / 231); textbooks print 1714, so within 0.5", () => {
    expect(Math.abs(GPM_PSI_PER_HORSEPOWER - 1714)).toBeLessThanOrEqual(0.5);
    const oneGpmAtOnePsiInHp = unit(1, "gallon/minute").multiply(unit(1, "psi")).toNumber("hp");
    expectRelative(GPM_PSI_PER_HORSEPOWER, 1 / oneGpmAtOnePsiInHp, ORACLE_RELATIVE);
  });

  it("lb·ft × rpm per hp is 5252.11 (33,000 / 2π); textbooks print 5252, so within 0.5", () => {
    expect(Math.abs(LB_FT_RPM_PER_HORSEPOWER - 5252)).toBeLessThanOrEqual(0.5);
    // 1 hp at 1 rev/min: torque = power / angular speed = 1 hp × 1 min / 2π rad.
    const torqueLbFt = evaluate("1 hp * 1 minute / (2 pi)").toNumber("lbf ft");
    expectRelative(LB_FT_RPM_PER_HORSEPOWER, torqueLbFt, ORACLE_RELATIVE);
  });

  it("1 hp is 2544 Btu/h as the trade reference prints it; the IT Btu gives 2544.43, so within 0.5", () => {
    expect(Math.abs(BTU_PER_HOUR_PER_HORSEPOWER - unit(1, "hp").toNumber("BTU/h"))).toBeLessThanOrEqual(0.5);
  });

  it("kW = L/min × bar / 600 exactly (fluid-power textbook metric form), checked with mathjs", () => {
    const kwForOneLpmAtOneBar = unit(1, "L/minute").multiply(unit(1, "bar")).toNumber("kW");
    expectRelative(1 / LPM_BAR_PER_KILOWATT, kwForOneLpmAtOneBar, ORACLE_RELATIVE);
  });

  it("oil at 0.87 kg/L (from memory, ISO VG 46) is 7.26 lb/gal to the printed 0.01, i.e. within 0.005", () => {
    const poundsPerGallon = unit(0.87, "kg/L").toNumber("lbm/gallon");
    expect(Math.abs(OIL_POUNDS_PER_GALLON - poundsPerGallon)).toBeLessThanOrEqual(0.005);
    // Data sheets give 0.86–0.88 kg/L; the constant must sit inside that span.
    expect(OIL_POUNDS_PER_GALLON).toBeGreaterThan(unit(0.86, "kg/L").toNumber("lbm/gallon"));
    expect(OIL_POUNDS_PER_GALLON).toBeLessThan(unit(0.88, "kg/L").toNumber("lbm/gallon"));
  });
});
