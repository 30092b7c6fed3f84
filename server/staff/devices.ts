/**
 * A signed-in device as its owner would name it, from the browser's User-Agent: the browser and
 * the system, e.g. "Chrome on Android". Rough on purpose; it only tells a person's devices apart.
 */
export function deviceName(userAgent: string): string {
  const ua = userAgent;
  if (!ua) return "Unknown browser";
  const system = /Android/.test(ua)
    ? "Android"
    : /iPhone|iPad|iPod/.test(ua)
      ? "iPhone or iPad"
      : /Windows/.test(ua)
        ? "Windows"
        : /Mac OS X|Macintosh/.test(ua)
          ? "Mac"
          : /CrOS/.test(ua)
            ? "Chromebook"
            : /Linux/.test(ua)
              ? "Linux"
              : null;
  const browser = /Edg\//.test(ua)
    ? "Edge"
    : /Firefox\/|FxiOS/.test(ua)
      ? "Firefox"
      : /Chrome\/|CriOS|Chromium\//.test(ua)
        ? "Chrome"
        : /Safari\//.test(ua)
          ? "Safari"
          : null;
  if (!browser && !system) return "Other browser";
  return `${browser ?? "A browser"}${system ? ` on ${system}` : ""}`;
}
