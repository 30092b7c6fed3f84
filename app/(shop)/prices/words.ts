import type { KitUse, LineKind } from "@/db/tables/money";

export { LINE_KIND_WORDS as KIND_WORDS } from "@/server/money/document";

export const KIT_USE_WORDS: Record<KitUse, string> = { pto: "PTO", pump: "Pump", reservoir: "Reservoir", hose: "Hose" };
