/** Part kinds, materials, shapes and gloss levels with their labels: the part and coating forms and the schemas share them. */

// Powder-coat gloss levels as coaters quote them (common practice, no published source).
export const GLOSS_LEVELS = ["flat", "matte", "satin", "semi_gloss", "gloss", "high_gloss"] as const;

export const PART_KINDS = ["reservoir", "box", "bracket", "other"] as const;
export type PartKind = (typeof PART_KINDS)[number];
export const PART_MATERIALS = ["aluminum", "stainless", "carbon_steel"] as const;
export type PartMaterial = (typeof PART_MATERIALS)[number];
export const PART_SHAPES = ["round", "box", "d", "other"] as const;

export const partKindLabels: Record<PartKind, string> = { reservoir: "Reservoir", box: "Box", bracket: "Bracket", other: "Other" };
export const partMaterialLabels: Record<PartMaterial, string> = { aluminum: "Aluminum", stainless: "Stainless", carbon_steel: "Carbon steel" };
export const partShapeLabels: Record<(typeof PART_SHAPES)[number], string> = {
  round: "Round (horizontal tube)",
  box: "Box (flat walls)",
  d: "D-shaped (flat side on the rail)",
  other: "Other shape",
};
export const glossLabels: Record<(typeof GLOSS_LEVELS)[number], string> = {
  flat: "Flat",
  matte: "Matte",
  satin: "Satin",
  semi_gloss: "Semi-gloss",
  gloss: "Gloss",
  high_gloss: "High gloss",
};

/**
 * What a part of each kind starts with. A reservoir is always leak-tested (trade reference, leak
 * test); a box, bracket or other part is not unless someone ticks it. Only a reservoir carries tank
 * geometry; a box part has flat walls. Changing a part's kind resets these, so a reservoir turned
 * into a bracket does not keep asking for a leak test.
 */
export function kindDefaults(kind: PartKind, currentShape: (typeof PART_SHAPES)[number] = "round") {
  switch (kind) {
    case "reservoir":
      return { needsLeakTest: true, shape: currentShape, keepsGeometry: true };
    case "box":
      return { needsLeakTest: false, shape: "box" as const, keepsGeometry: false };
    default:
      return { needsLeakTest: false, shape: "other" as const, keepsGeometry: false };
  }
}
