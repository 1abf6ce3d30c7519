import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { currentActor } from "@/app/_server/auth";
import { authMode, can } from "@/lib/db/auth-mode";
import { listAccounts } from "@/lib/db/accounts";
import { NewAccountForm } from "./NewAccountForm";
import { setDisabledAction } from "./actions";

/** Accounts of a shared install: editors see and add them, and can disable one (which ends its sessions). */
export default async function AccountsPage() {
  if (authMode() === "none") notFound();
  const actor = await currentActor();
  if (!can("accounts", actor, "edit")) {
    return (
      <>
        <h1>Accounts</h1>
        <p>Only an editor can see and add accounts.</p>
      </>
    );
  }
  const accounts = await listAccounts(await getDb());
  return (
    <>
      <h1>Accounts</h1>
      <p className="muted">Editors change templates, rule sets and settings, and make plans; planners make plans. A disabled account cannot sign in, and its sessions end.</p>
      <table className="list" data-testid="accounts">
        <thead>
          <tr>
            <th>Username</th>
            <th>Name</th>
            <th>Role</th>
            <th>State</th>
            <th />
          </tr>
        </thead>
        <tbody>
          {accounts.map((a) => (
            <tr key={a.id}>
              <td>{a.username}</td>
              <td>{a.displayName}</td>
              <td>{a.role}</td>
              <td>{a.disabled ? "disabled" : "active"}</td>
              <td>
                {a.id === actor?.id ? (
                  "you"
                ) : (
                  <form action={setDisabledAction}>
                    <input type="hidden" name="id" value={a.id} />
                    <input type="hidden" name="disabled" value={a.disabled ? "0" : "1"} />
                    <button type="submit" className="secondary">
                      {a.disabled ? "Enable" : "Disable"}
                    </button>
                  </form>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <h2>Add an account</h2>
      <NewAccountForm />
    </>
  );
}
