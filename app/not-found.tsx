import Link from "next/link";

/**
 * Shown for an address that matches no page, and wherever a page calls `notFound()` (a template or
 * saved plan that does not exist, an id that is not an id). Next answers it with status 404.
 */
export default function NotFound() {
  return (
    <section className="status-page" data-testid="not-found">
      <p className="status-code">404</p>
      <h1>No page here</h1>
      <p className="lede">
        There is no page at this address. The link may be mistyped, or the template or saved plan it pointed to has been deleted.
      </p>
      <p>
        <Link href="/" className="button" data-testid="home-link">
          Go to the start page
        </Link>
      </p>
      <p className="muted">
        Or open the <Link href="/hold">hold planner</Link>, the <Link href="/library/products">library</Link> or your{" "}
        <Link href="/plans">saved plans</Link>.
      </p>
    </section>
  );
}
