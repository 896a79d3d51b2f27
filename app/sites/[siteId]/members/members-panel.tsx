"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiClient, type ApiAnswer } from "@/lib/api/client";
import { roles, roleSchema } from "@/lib/schemas/common";

type Member = ApiAnswer<"membersList">[number];

export function MembersPanel({ siteId, canManage, selfId }: { siteId: string; canManage: boolean; selfId: string }) {
  const qc = useQueryClient();
  const key = ["members", siteId];
  const members = useQuery({ queryKey: key, queryFn: () => apiClient.call("membersList", { siteId }) });
  const done = () => qc.invalidateQueries({ queryKey: key });
  const change = useMutation({
    mutationFn: (m: Pick<Member, "userId" | "role">) =>
      apiClient.call("memberUpdate", { siteId, userId: m.userId }, { role: m.role }),
    onSuccess: done,
  });
  const remove = useMutation({
    mutationFn: (userId: string) => apiClient.call("memberRemove", { siteId, userId }),
    onSuccess: done,
  });
  const failure = change.error ?? remove.error;

  return (
    <div className="space-y-4">
      <table className="ledger">
        <thead>
          <tr>
            <th>Name</th>
            <th>E-mail</th>
            <th>Role</th>
            {canManage && <th />}
          </tr>
        </thead>
        <tbody>
          {members.data?.map((m) => (
            <tr key={m.userId}>
              <td>{m.name}</td>
              <td className="font-mono text-xs">{m.email}</td>
              <td>
                {canManage ? (
                  <select
                    aria-label={`Role of ${m.name}`}
                    className="field max-w-40"
                    value={m.role}
                    onChange={(e) => change.mutate({ userId: m.userId, role: roleSchema.parse(e.target.value) })}
                  >
                    {roles.map((r) => (
                      <option key={r} value={r}>
                        {r}
                      </option>
                    ))}
                  </select>
                ) : (
                  m.role
                )}
              </td>
              {canManage && (
                <td>
                  {m.userId !== selfId && (
                    <button className="btn" onClick={() => remove.mutate(m.userId)}>
                      Take off site
                    </button>
                  )}
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
      {members.isLoading && <p>Loading members…</p>}
      <p className="field-error" role="alert" aria-live="polite">
        {failure?.message}
      </p>
    </div>
  );
}
