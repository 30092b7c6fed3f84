import type { KitUse, LineKind } from "@/db/tables/money";

export const KIND_WORDS: Record<LineKind, string> = {
  labour: "Labour",
  part: "Bought-in part",
  fabrication: "Fabricated part",
  coating: "Outside coating",
  fee: "Fee",
};

export const KIT_USE_WORDS: Record<KitUse, string> = { pto: "PTO", pump: "Pump", reservoir: "Reservoir", hose: "Hose" };
