"use client";

/** The last resort when even the page frame fails: plain markup, no shared styles to depend on. */
export default function GlobalError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en">
      <head>
        <title>Something went wrong · Baywright</title>
      </head>
      <body style={{ fontFamily: "system-ui, sans-serif", maxWidth: "36rem", margin: "0 auto", padding: "2.5rem 1.25rem", color: "#16252b", background: "#f5f3ee" }}>
        <main>
          <h1>Baywright could not be shown</h1>
          <p>Something went wrong on the server. Try again; if it keeps happening, tell whoever looks after Baywright in the shop{error.digest ? ` (reference ${error.digest})` : ""}.</p>
          <p style={{ display: "flex", gap: "0.5rem" }}>
            <button type="button" onClick={reset} style={{ minHeight: 44, padding: "0 1rem", fontWeight: 600 }}>Try again</button>
            <a href="/board" style={{ minHeight: 44, display: "inline-flex", alignItems: "center", color: "#0e5a54", fontWeight: 600 }}>Go to the board</a>
          </p>
        </main>
      </body>
    </html>
  );
}
