import type { ColumnType, Generated } from "kysely";

export type PartKind = "reservoir" | "box" | "bracket" | "other";
export type PartMaterial = "aluminum" | "stainless" | "carbon_steel";
/** "d": a D-shaped tank, a flat side against the frame rail and a half round outboard (migration 0014). */
export type PartShape = "round" | "box" | "d" | "other";

export interface PartTable {
  id: Generated<number>;
  job_id: number;
  name: string;
  kind: PartKind;
  material: PartMaterial;
  shape: PartShape;
  /** JSON of the reservoir's geometry ({ shape, insideDiameterIn, lengthIn } or { shape: "box" | "d", lengthIn, widthIn, heightIn }). */
  geometry: string | null;
  needs_leak_test: number;
  needs_coating: number;
  notes: string;
  /** Bumped by every rework; a leak test counts only for the generation it was recorded in. */
  rework_count: number;
  reworked_at: string | null;
  rework_note: string;
  created_at: string;
  updated_at: string;
}

export interface LeakTestTable {
  id: Generated<number>;
  part_id: number;
  rework_count: number;
  method: "soap" | "decay" | "both";
  part_shape: PartShape;
  test_pressure_psig: number;
  gauge_full_scale_psi: number;
  gauge_calibrated_on: string;
  hold_minutes: number;
  /** The hold readings and drops are null only for a soap-only test recorded without them (migration 0023). */
  start_pressure_psig: number | null;
  end_pressure_psig: number | null;
  start_temp_f: number | null;
  end_temp_f: number | null;
  barometric_psia: number;
  /** JSON array of { location, result: "pass" | "leak" }. */
  seams: string;
  tester: string;
  raw_drop_psi: number | null;
  corrected_drop_psi: number | null;
  allowed_drop_psi: number;
  result: "pass" | "fail" | "invalid";
  /** JSON array of { code, message }. */
  warnings: string;
  /** JSON array of { code, message }: why an invalid test broke the procedure. */
  invalid_reasons: ColumnType<string, string | undefined, string>;
  recorded_by: string | null;
  tested_at: string;
}

export interface VendorTable {
  id: Generated<number>;
  name: string;
  contact: string;
  phone: string;
  email: string;
  usual_turnaround_days: number;
  notes: string;
  created_at: string;
}

export interface CoatingRunTable {
  id: Generated<number>;
  vendor_id: number;
  finish_colour: string;
  finish_gloss: string;
  sent_on: string;
  promised_on: string;
  received_on: string | null;
  /** JSON array of dry-film-thickness readings, mils. */
  dft_readings_mils: string | null;
  adhesion_ok: number | null;
  defects: string | null;
  inspected_at: string | null;
  inspected_by: string | null;
  created_by: string | null;
  created_at: string;
  updated_at: string;
  /** What the coater charged for the whole run, integer cents; null until recorded (migration 0014b). */
  price_cents: ColumnType<number | null, number | null | undefined, number | null>;
}

export interface CoatingRunPartTable {
  run_id: number;
  part_id: number;
  /** 1 while the run is out at the coater. */
  open: number;
  /** The part's rework_count when it was sent; the run counts for the gate only while it matches. */
  rework_count: Generated<number>;
}

export interface SignOffTable {
  id: Generated<number>;
  job_id: number;
  /** JSON of the saved sign-off fields (WiringSignOff). */
  fields: string;
  complete: number;
  signed_by: string | null;
  signed_by_staff_id: string | null;
  signed_at: string | null;
  updated_by: string | null;
  /** 1 on the first save, bumped by each save after. */
  version: Generated<number>;
  created_at: string;
  updated_at: string;
}

/** Tables of the shop's records (parts, leak tests, vendors, coating runs, sign-off). Filled by migration 0003. */
export interface RecordsTables {
  part: PartTable;
  leak_test: LeakTestTable;
  vendor: VendorTable;
  coating_run: CoatingRunTable;
  coating_run_part: CoatingRunPartTable;
  sign_off: SignOffTable;
}
