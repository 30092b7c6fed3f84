import { KitCalculator } from "@/components/kit-calc/kit-calculator";
import { requirePageStaff } from "@/server/auth/session";
import { computeKitSpec, demoKitCalcInput } from "@/server/kit-calc";

export const metadata = { title: "Wet-kit calculator" };

export default async function CalculatorPage() {
  await requirePageStaff();
  return (
    <div className="space-y-4">
      <header className="max-w-3xl space-y-1">
        <h1 className="text-2xl font-bold">Wet-kit calculator</h1>
        <p className="text-ink-soft">
          Size the pump, reservoir and lines before cutting metal. Starts with the shop&rsquo;s usual kit for a day cab pulling a hydraulic
          detachable-gooseneck trailer; change any box and the results follow. To keep a kit spec with a truck, open its job.
        </p>
      </header>
      <KitCalculator start={demoKitCalcInput} startAnswer={computeKitSpec(demoKitCalcInput)} />
    </div>
  );
}
