import { redirect } from "next/navigation";
import { authMode } from "@/lib/db/auth-mode";
import { currentActor } from "@/app/_server/auth";
import { safeNext } from "@/app/_server/session";
import { signInAction } from "./actions";

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; failed?: string; wait?: string }> }) {
  const sp = await searchParams;
  const next = safeNext(sp.next);
  if (authMode() === "none") redirect(next);
  const actor = await currentActor();
  return (
    <>
      <h1>Sign in</h1>
      <p className="muted">
        This Holdline library is shared by your group. Editors change templates and rule sets; planners make plans. Ask an editor for an account.
      </p>
      {actor ? <p className="banner ok">You are signed in as {actor.name} ({actor.role}).</p> : null}
      {sp.wait && /^\d{1,4}$/.test(sp.wait) ? (
        <div className="banner error" role="alert">
          <p>Too many wrong passwords for this username. Try again in {sp.wait} seconds.</p>
        </div>
      ) : null}
      {sp.failed ? (
        <div className="banner error" role="alert">
          <p>Unknown username or wrong password.</p>
        </div>
      ) : null}
      <form action={signInAction} className="template-form" style={{ maxWidth: "24rem" }}>
        <input type="hidden" name="next" value={next} />
        <div className="field">
          <label htmlFor="username">Username</label>
          <input id="username" name="username" autoComplete="username" required />
        </div>
        <div className="field">
          <label htmlFor="password">Password</label>
          <input id="password" name="password" type="password" autoComplete="current-password" required />
        </div>
        <div className="form-actions">
          <button type="submit">Sign in</button>
        </div>
      </form>
    </>
  );
}
