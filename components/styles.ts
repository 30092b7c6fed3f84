/** Shared class lists; a plain module so server components can use them too. */
export const inputClass =
  "block w-full min-h-11 rounded-md border border-line bg-panel px-3 py-2 text-base text-ink shadow-inner placeholder:text-ink-soft/60 focus:border-bay-600 aria-[invalid=true]:border-stop-700";

export const buttonClass = {
  primary:
    "inline-flex min-h-11 items-center justify-center gap-2 rounded-md bg-bay-700 px-4 py-2 font-semibold text-white hover:bg-bay-800 disabled:opacity-60",
  secondary:
    "inline-flex min-h-11 items-center justify-center gap-2 rounded-md border border-line bg-panel px-4 py-2 font-semibold text-ink hover:bg-bay-50 disabled:opacity-60",
  danger:
    "inline-flex min-h-11 items-center justify-center gap-2 rounded-md bg-stop-700 px-4 py-2 font-semibold text-white hover:opacity-90 disabled:opacity-60",
};

/**
 * A link inside text or a table row that a finger must hit: 44 px tall on a phone or any touch
 * screen, one line of text under a mouse at the desk so dense tables stay dense.
 */
export const touchLinkClass =
  "max-sm:inline-flex max-sm:min-h-11 max-sm:items-center pointer-coarse:inline-flex pointer-coarse:min-h-11 pointer-coarse:items-center";
