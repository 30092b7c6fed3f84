import { createRequire } from "node:module";
import path from "node:path";

const fontDir = `${path.join(path.dirname(createRequire(import.meta.url).resolve("pdfjs-dist/package.json")), "standard_fonts")}/`;

/**
 * The text of each page of a PDF, read by Mozilla's PDF.js (an independent reader, so a test checks
 * what a customer's viewer shows, not what the writer meant to draw). Items on a page are joined
 * with a space; each page is one string.
 */
export async function pdfPages(bytes: Uint8Array | Buffer): Promise<string[]> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), standardFontDataUrl: fontDir, isEvalSupported: false, verbosity: 0 }).promise;
  const pages: string[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const content = await (await doc.getPage(n)).getTextContent();
    pages.push(
      content.items
        .map((i) => ("str" in i ? i.str : ""))
        .filter((s) => s.trim() !== "")
        .join(" "),
    );
  }
  await doc.destroy();
  return pages;
}
