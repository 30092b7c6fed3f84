import type { Generated } from "kysely";

export interface KitSpecTable {
  id: Generated<number>;
  job_id: number;
  /** 1, 2, 3… per job; the highest is the spec in force. */
  version: number;
  /** The calculator's inputs as JSON, parsed by kitCalcInputSchema before they were stored. */
  inputs: string;
  /** What the server computed from those inputs at save time, as JSON. */
  results: string;
  saved_by: string;
  saved_at: string;
}

/** Tables of the saved wet-kit calculator results on a job. Filled by migration 0004. */
export interface KitSpecTables {
  kit_spec: KitSpecTable;
}
