"use client";
import { useActionState } from "react";
import { createAccountAction, type NewAccountState } from "./actions";

const EMPTY: NewAccountState = { ok: false, message: "", fieldErrors: {}, values: { username: "", displayName: "", role: "planner" } };

export function NewAccountForm() {
  const [state, action, pending] = useActionState(createAccountAction, EMPTY);
  const v = state.values;
  const err = (f: string) =>
    state.fieldErrors[f] ? (
      <p className="field-error" id={`acct-${f}-err`}>
        {state.fieldErrors[f].join("; ")}
      </p>
    ) : null;
  return (
    <form action={action} className="template-form" style={{ maxWidth: "28rem" }} data-testid="new-account">
      {state.message ? (
        <div className={`banner ${state.ok ? "ok" : "error"}`} role="alert">
          <p>{state.message}</p>
        </div>
      ) : null}
      <div className="field">
        <label htmlFor="acct-username">Username</label>
        <input id="acct-username" name="username" defaultValue={v.username} required autoComplete="off" aria-invalid={!!state.fieldErrors.username} />
        {err("username")}
      </div>
      <div className="field">
        <label htmlFor="acct-displayName">Name</label>
        <input id="acct-displayName" name="displayName" defaultValue={v.displayName} required aria-invalid={!!state.fieldErrors.displayName} />
        {err("displayName")}
      </div>
      <div className="field">
        <label htmlFor="acct-password">Password (10 characters or more)</label>
        <input id="acct-password" name="password" type="password" required autoComplete="new-password" aria-invalid={!!state.fieldErrors.password} />
        {err("password")}
      </div>
      <div className="field">
        <label htmlFor="acct-role">Role</label>
        <select id="acct-role" name="role" defaultValue={v.role || "planner"} key={v.role}>
          <option value="planner">planner: makes plans</option>
          <option value="editor">editor: also changes templates, rule sets and settings</option>
        </select>
        {err("role")}
      </div>
      <div className="form-actions">
        <button type="submit" disabled={pending}>
          {pending ? "Adding…" : "Add this account"}
        </button>
      </div>
    </form>
  );
}
