"use client";
import Link from "next/link";
import { useEffect } from "react";

/** The server's reference of an error thrown while rendering on the server (Next's `digest`), if any. */
function digestOf(error: unknown): string | null {
  if (typeof error !== "object" || error === null || !("digest" in error)) return null;
  const d = (error as { digest?: unknown }).digest;
  return typeof d === "string" && d.length > 0 ? d : null;
}

/**
 * Shown when a page fails while it is being prepared or used (the root layout's header stays). Plain
 * words and a way out; never the error's message or stack, which may name files or queries. `retry`
 * (Next 16) fetches the page again and renders it; the reference is what the server log records.
 */
export default function ErrorPage({ error, retry }: { error: unknown; retry: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  const ref = digestOf(error);
  return (
    <section className="status-page" role="alert" data-testid="error-page">
      <h1>This page could not be shown</h1>
      <p className="lede">
        Something went wrong while preparing this page. Try again; if it keeps happening, go to the start page and open the page
        from there. Anything you had typed into a form on this page may need to be entered again.
      </p>
      <p className="status-actions">
        <button type="button" onClick={() => retry()} data-testid="retry">
          Try again
        </button>
        <Link href="/">Go to the start page</Link>
      </p>
      {ref ? <p className="muted">Reference for the server log: {ref}</p> : null}
    </section>
  );
}
