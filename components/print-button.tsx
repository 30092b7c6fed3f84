"use client";

export function PrintButton({ label = "Print shop sheet" }: { label?: string }) {
  return (
    <button type="button" onClick={() => window.print()} className="no-print min-h-11 rounded-md border border-line bg-panel px-3 font-semibold hover:bg-bay-50">
      {label}
    </button>
  );
}
