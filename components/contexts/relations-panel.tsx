"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { readingLabels, relationCreateSchema, relationReadings } from "@/lib/schemas/relation";
import { ApiError, apiClient } from "@/lib/api/client";
import type { RelationReadingRow } from "@/lib/api/responses";
import { applyFieldErrors, FormField } from "./form-field";

type Input = z.input<typeof relationCreateSchema>;

/** The sheet's relations, each stored once and read here from this context's side. */
export function RelationsPanel({
  siteId,
  contextId,
  number,
  others,
  canEdit,
}: {
  siteId: string;
  contextId: string;
  number: number;
  others: { id: string; number: number }[];
  canEdit: boolean;
}) {
  const key = ["relations", siteId, contextId];
  const list = useQuery({
    queryKey: key,
    queryFn: () => apiClient.call("relationsList", { siteId }, { contextId }),
    select: (rows) => rows.filter((r): r is RelationReadingRow => "relationId" in r),
  });
  const { register, handleSubmit, setError, reset, formState } = useForm<Input>({
    resolver: zodResolver(relationCreateSchema),
    defaultValues: { contextId, reading: "above", otherId: "" },
  });
  const add = useMutation({
    mutationFn: (v: Input) => apiClient.call("relationsCreate", { siteId }, v),
    onSuccess: () => reset({ contextId, reading: "above", otherId: "" }),
    onError: (err) => {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setError("root", { message: err.message });
    },
  });
  const remove = useMutation({
    mutationFn: (id: string) => apiClient.call("relationDelete", { siteId, relationId: id }),
  });
  const e = formState.errors;

  return (
    <section className="sheet space-y-3" aria-labelledby="relations-h">
      <h2 id="relations-h" className="text-lg font-bold">
        Stratigraphic relations
      </h2>
      {list.isLoading && <p>Reading relations…</p>}
      {list.data?.length === 0 && <p className="text-ink-soft">No relations yet.</p>}
      <ul className="space-y-1">
        {list.data?.map((r) => (
          <li key={r.relationId} className="flex min-h-11 items-center gap-3">
            <span>
              <span className="num font-bold">{number}</span> {r.label}{" "}
              <Link className="num underline" href={`/sites/${siteId}/contexts/${r.otherId}`}>
                {r.otherNumber}
              </Link>
            </span>
            {r.redundant && (
              <span
                className="rounded bg-paper-deep px-2 text-xs text-ink-soft"
                title="Another chain of relations already says this"
              >
                redundant
              </span>
            )}
            {canEdit && (
              <button
                type="button"
                className="btn ml-auto"
                onClick={() => remove.mutate(r.relationId)}
                aria-label={`Remove: ${number} ${r.label} ${r.otherNumber}`}
              >
                Remove
              </button>
            )}
          </li>
        ))}
      </ul>
      <p className="field-error" role="alert" aria-live="polite">
        {remove.error?.message ?? ""}
      </p>
      {canEdit && (
        <form
          className="flex flex-wrap items-start gap-3 border-t border-paper-edge pt-3"
          onSubmit={handleSubmit((v) => add.mutate(v))}
          noValidate
          aria-label="Add a relation"
        >
          <p className="pt-8 font-mono font-bold">{number}</p>
          <FormField id="rel-reading" label="Relation" error={e.reading?.message}>
            <select id="rel-reading" className="field" {...register("reading")}>
              {relationReadings.map((r) => (
                <option key={r} value={r}>
                  {readingLabels[r]}
                </option>
              ))}
            </select>
          </FormField>
          <div className="min-w-48 grow">
            <FormField id="rel-other" label="Other context" error={e.otherId?.message}>
              <select id="rel-other" className="field num" aria-describedby="rel-other-error" {...register("otherId")}>
                <option value="">— pick —</option>
                {others.map((o) => (
                  <option key={o.id} value={o.id}>
                    {o.number}
                  </option>
                ))}
              </select>
            </FormField>
          </div>
          <button type="submit" className="btn-primary mt-6" disabled={add.isPending}>
            Add relation
          </button>
          <p className="field-error w-full" role="alert" aria-live="polite">
            {e.root?.message ?? ""}
          </p>
        </form>
      )}
    </section>
  );
}
