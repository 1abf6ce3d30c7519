import type { Metadata } from "next";
import Link from "next/link";
import "./globals.css";
import { UnitsProvider } from "./_components/units-context";
import { currentUnits } from "./_server/units";
import { currentActor } from "./_server/auth";
import { signOutAction } from "./signin/actions";
import { PLANNERS } from "@/lib/planners/registry";

export const metadata: Metadata = {
  title: "Holdline",
  description: "Hold times for chilled, frozen and hot food deliveries, thaw planning and pack-out sizing, from transient heat transfer.",
  // The app icon is a static file in public/, served as it is at /icon.svg.
  icons: { icon: "/icon.svg" },
};

export const dynamic = "force-dynamic";

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  const units = await currentUnits();
  const actor = await currentActor();
  return (
    <html lang="en">
      <body>
        <header className="site">
          <Link href="/" className="brand">
            Holdline
          </Link>
          <nav aria-label="Main">
            {Object.values(PLANNERS).map((e) => (
              <Link key={e.kind} href={e.path}>
                {e.title}
              </Link>
            ))}
            <span className="nav-sep" />
            <span className="nav-group">Library:</span>
            <Link href="/library/products">Products</Link>
            <Link href="/library/shippers">Boxes</Link>
            <Link href="/library/packs">Coolant packs</Link>
            <Link href="/library/routes">Routes</Link>
            <Link href="/library/rulesets">Rule sets</Link>
            <Link href="/library/materials">Materials</Link>
            <span className="nav-sep" />
            <Link href="/plans">Saved plans</Link>
            <Link href="/settings">Units</Link>
          </nav>
          <span className="units-now" data-testid="units-now">
            {units.temperatureUnit === "C" ? "°C" : "°F"} · {units.massUnit} · {units.lengthUnit}
          </span>
          {actor ? (
            <form action={signOutAction} className="signed-in" data-testid="signed-in">
              {actor.name} ({actor.role}) {actor.role === "editor" ? <Link href="/accounts">Accounts</Link> : null} <button type="submit">Sign out</button>
            </form>
          ) : null}
        </header>
        <UnitsProvider prefs={units}>
          <main>{children}</main>
        </UnitsProvider>
      </body>
    </html>
  );
}
