// Citations shown beside each result and each velocity band. Plain text so a page can print them as is.
export const sources = {
  nistUnits: "NIST Handbook 44, Appendix C (exact US customary and SI definitions)",
  fluidPowerPump: "Fluid-power textbook formulas (e.g. Fluid Power with Applications, ch. 5: pump flow, power, torque)",
  fluidPowerLines: "Fluid-power textbook formulas (e.g. Fluid Power with Applications, ch. 10: conductor sizing)",
  segmentGeometry: "Circular segment area and arc length (any geometry handbook)",
  solidGeometry: "Cylinder and box volume and surface area (elementary geometry)",
  mobileReservoirSizing:
    "Reservoir sizing guidance: about 3 × pump flow per minute in industrial practice (ANSI/NFPA T3.16.2 is the recommended practice), down to about 1 × in mobile equipment",
  tankHeatRule:
    "Equipment suppliers' rules of thumb for a bare steel tank in free air (2.0–2.5 Btu/h·ft²·°F); an estimate, not a published standard",
  oilDensity: "From memory: mineral hydraulic oil ISO VG 46 about 0.87 kg/L (data sheets give 0.86–0.88)",
  airSpace: "From memory: leave about 10 % air space above the oil",
  commonPractice: "Common practice, no published source",
} as const;
