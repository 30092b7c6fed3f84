// Citations shown beside each result and each velocity band. Plain text so a page can print them as is.
// Each one states its standing: a named document, a textbook formula, geometry, "from memory" where the
// digits were not read from the document here, or "common practice, no published source".
export const sources = {
  nistUnits: "NIST Handbook 44, Appendix C (exact definitions of length, area, volume and mass: 1 in = 2.54 cm, 1 gal = 231 in³)",
  nistSp811:
    "NIST SP 811, Appendix B (conversion factors for psi, bar, horsepower and standard gravity; digits from memory, checked against mathjs units)",
  fluidPowerPump:
    "Fluid-power textbook formulas (pump flow, power and torque, as in the pumps chapter of Fluid Power with Applications; from memory)",
  fluidPowerLines:
    "Fluid-power textbook formulas (flow = velocity × area, as in the conductor-sizing chapter of Fluid Power with Applications; from memory)",
  fluidFriction:
    "Darcy–Weisbach pipe friction with the Hagen–Poiseuille laminar factor 64/Re and the Blasius smooth-pipe factor 0.316/Re^0.25 (fluid-mechanics textbook formulas; from memory)",
  segmentGeometry: "Circular segment area and arc length (any geometry handbook)",
  solidGeometry: "Cylinder and box volume and surface area (elementary geometry)",
  mobileReservoirSizing:
    "Common practice, from memory: about 3 × pump flow per minute for an industrial reservoir, down to about 1 × on mobile equipment (no standard's text was read for this)",
  tankHeatRule:
    "Equipment suppliers' rules of thumb for a bare steel tank in free air (2.0–2.5 Btu/h·ft²·°F; from memory); an estimate, not a published standard",
  oilDensity: "From memory: mineral hydraulic oil ISO VG 46 about 0.87 kg/L (data sheets give 0.86–0.88)",
  airSpace: "From memory: leave about 10 % air space above the oil",
  commonPractice: "Common practice, no published source",
  viscosity:
    "ISO 3448 viscosity grades (from memory: ISO VG 46 is 46 cSt at 40 °C); about 500 cSt near freezing is from memory, take the oil's data sheet",
  inletLimit: "From memory: gear-pump makers commonly allow about 5 inHg at the inlet; the pump's data sheet rules",
  oilExpansion: "From memory: mineral oil grows about 0.07 % per °C (data sheets 0.065–0.08 %)",
} as const;
