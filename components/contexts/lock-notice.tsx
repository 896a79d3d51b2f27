/** Why a sheet (and its finds and relations) cannot be changed now, in the words the server refuses with. */
export function LockNotice({
  state,
  number,
  who,
  at,
}: {
  state: string;
  number: number;
  who: string | null;
  at: string | null;
}) {
  if (state === "open") return null;
  const signed = state === "signed_off";
  return (
    <div
      role="status"
      className={`rounded border-2 p-3 ${signed ? "border-ok bg-ok-light text-ok" : "border-accent bg-accent-light text-accent-dark"}`}
    >
      <p className="font-bold">
        {signed
          ? `Signed off by ${who ?? "a director"} on ${at ?? "an earlier date"}`
          : `Submitted for sign-off by ${who ?? "a recorder"} on ${at ?? "an earlier date"}`}
      </p>
      <p className="text-sm">
        {signed
          ? `Context ${number}, its finds and its relations are locked. Only a director can reopen it, with a stated reason.`
          : `Context ${number} is frozen while it awaits sign-off, so the director signs exactly what was submitted. A director can return it to open with a reason.`}
      </p>
    </div>
  );
}
