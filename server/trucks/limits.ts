/** Longest texts, model years and engine speeds a truck record takes; the form and the schemas share them. */
export const TRUCK_LIMITS = {
  unitNumber: 40,
  description: 200,
  transmission: 80,
  make: 40,
  model: 60,
  ptoOpening: 80,
  firstYear: 1980,
  rpmMin: 500,
  rpmMax: 3000,
  search: 120,
} as const;
