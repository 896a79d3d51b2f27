"use client";

import { useDates } from "@/components/locale";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { apiClient } from "@/lib/api/client";
import { roles } from "@/lib/schemas/common";

/** Invite people by e-mail (director); the link in the message expires after 7 days and works once. */
export function InvitationsPanel({ siteId }: { siteId: string }) {
  const { when: day } = useDates();
  const qc = useQueryClient();
  const key = ["invitations", siteId];
  const list = useQuery({ queryKey: key, queryFn: () => apiClient.call("invitationsList", { siteId }) });
  const [email, setEmail] = useState("");
  const [role, setRole] = useState<(typeof roles)[number]>("digger");
  const [note, setNote] = useState<string | null>(null);
  const send = useMutation({
    mutationFn: () => apiClient.call("invitationsCreate", { siteId }, { email, role }),
    onSuccess: (r) => {
      setNote(
        r.mail.failed
          ? `The invitation was saved but the e-mail could not be sent (${r.mail.error ?? "mail relay refused"}). Try again later.`
          : `Invitation sent to ${r.invitation.email}.`,
      );
      setEmail("");
      qc.invalidateQueries({ queryKey: key });
    },
  });
  const revoke = useMutation({
    mutationFn: (id: string) => apiClient.call("invitationRevoke", { siteId, invitationId: id }),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
  });
  const failure = send.error ?? revoke.error;
  return (
    <section aria-labelledby="invite-h" className="space-y-3">
      <h2 id="invite-h" className="text-xl font-bold">
        Invitations
      </h2>
      <form
        className="sheet flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          setNote(null);
          send.mutate();
        }}
      >
        <div className="grow">
          <label className="label" htmlFor="invite-email">
            Invite a person by e-mail
          </label>
          <input
            id="invite-email"
            className="field"
            type="email"
            value={email}
            onChange={(e) => setEmail(e.target.value)}
            required
          />
        </div>
        <div>
          <label className="label" htmlFor="invite-role">
            Invite as
          </label>
          <select
            id="invite-role"
            className="field"
            value={role}
            onChange={(e) => setRole(e.target.value as typeof role)}
          >
            {roles.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </select>
        </div>
        <button className="btn-primary" type="submit" disabled={send.isPending}>
          {send.isPending ? "Sending…" : "Send invitation"}
        </button>
      </form>
      <p className="field-error" role="alert" aria-live="polite">
        {failure?.message}
      </p>
      {note && (
        <p className="text-sm text-ok" aria-live="polite">
          {note}
        </p>
      )}
      {list.data && list.data.length > 0 && (
        <table className="ledger">
          <thead>
            <tr>
              <th>E-mail</th>
              <th>Role</th>
              <th>State</th>
              <th>Sent by</th>
              <th>Expires (UTC)</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {list.data.map((i) => (
              <tr key={i.id}>
                <td className="font-mono text-xs">{i.email}</td>
                <td>{i.role}</td>
                <td>{i.status}</td>
                <td>{i.invitedByName}</td>
                <td className="num">{day(i.expiresAt)}</td>
                <td>
                  {i.status !== "accepted" && (
                    <button className="btn" onClick={() => revoke.mutate(i.id)}>
                      Withdraw
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
