import { z } from "zod";
import { type KitCalcInput, type KitSpec, kitCalcInputSchema } from "@/server/kit-calc";

// Not strict: a client may echo back the results it was shown; they are dropped here and computed again.
export const kitSpecSaveSchema = z
  .object({
    inputs: kitCalcInputSchema,
    // The version the editor started from; 0 means "there was no spec yet". Left out, the save always lands.
    expectedVersion: z
      .number({ error: "expectedVersion must be the version of the kit spec you edited (0 if there was none)." })
      .int({ error: "expectedVersion must be a whole number." })
      .gte(0, { error: "expectedVersion must be 0 or more." })
      .lte(1_000_000, { error: "expectedVersion is too large." })
      .optional(),
  });

export type KitSpecSave = z.infer<typeof kitSpecSaveSchema>;

/** A kit spec as the API answers it. */
export interface SavedKitSpec {
  version: number;
  inputs: KitCalcInput;
  results: KitSpec;
  savedBy: { id: string; name: string };
  savedAt: string;
}

export type KitSpecTank = {
  specVersion: number;
  tank: KitCalcInput["tank"];
  fillDepthIn: number | null;
  sumpGal: number | null;
};
