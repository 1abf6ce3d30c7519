"use client";
import Link from "next/link";
import "./globals.css";

/**
 * The last resort: shown when the root layout itself fails (for example the database cannot be opened),
 * in place of the whole document, so it brings its own <html>, <body> and styles. Plain words, no error
 * details; `retry` (Next 16) fetches the page again.
 */
export default function GlobalError({ retry }: { error: unknown; retry: () => void }) {
  return (
    <html lang="en">
      <body>
        <title>Holdline – page not shown</title>
        <header className="site">
          <Link href="/" className="brand">
            Holdline
          </Link>
        </header>
        <main>
          <section className="status-page" role="alert" data-testid="global-error">
            <h1>Holdline could not show this page</h1>
            <p className="lede">
              The app could not prepare its pages just now. Try again in a moment; if it keeps happening, the person who runs Holdline can
              find the cause in the server log.
            </p>
            <p className="status-actions">
              <button type="button" onClick={() => retry()}>
                Try again
              </button>
            </p>
          </section>
        </main>
      </body>
    </html>
  );
}
