"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/ui/fetch-json";
import { roles } from "@/lib/schemas/common";

type Member = { userId: string; name: string; email: string; role: (typeof roles)[number] };

export function MembersPanel({ siteId, canManage, selfId }: { siteId: string; canManage: boolean; selfId: string }) {
  const qc = useQueryClient();
  const key = ["members", siteId];
  const members = useQuery({ queryKey: key, queryFn: () => fetchJson<Member[]>(`/api/sites/${siteId}/members`) });
  const done = () => qc.invalidateQueries({ queryKey: key });
  const change = useMutation({ mutationFn: (m: { userId: string; role: string }) => fetchJson(`/api/sites/${siteId}/members/${m.userId}`, { method: "PATCH", body: { role: m.role } }), onSuccess: done });
  const remove = useMutation({ mutationFn: (userId: string) => fetchJson(`/api/sites/${siteId}/members/${userId}`, { method: "DELETE" }), onSuccess: done });
  const failure = change.error ?? remove.error;

  return (
    <div className="space-y-4">
      <table className="ledger">
        <thead><tr><th>Name</th><th>E-mail</th><th>Role</th>{canManage && <th />}</tr></thead>
        <tbody>
          {members.data?.map((m) => (
            <tr key={m.userId}>
              <td>{m.name}</td>
              <td className="font-mono text-xs">{m.email}</td>
              <td>
                {canManage ? (
                  <select aria-label={`Role of ${m.name}`} className="field max-w-40" value={m.role} onChange={(e) => change.mutate({ userId: m.userId, role: e.target.value })}>
                    {roles.map((r) => <option key={r} value={r}>{r}</option>)}
                  </select>
                ) : m.role}
              </td>
              {canManage && (
                <td>{m.userId !== selfId && <button className="btn" onClick={() => remove.mutate(m.userId)}>Take off site</button>}</td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
      {members.isLoading && <p>Loading members…</p>}
      <p className="field-error" role="alert" aria-live="polite">{failure?.message}</p>
    </div>
  );
}
