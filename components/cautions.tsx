/** Depth beyond which trench sides need support or stepping: about 1.2 m (common practice; no single source). */
export const DEEP_TRENCH_M = 1.2;

import Link from "next/link";

/** Where a caution points: the record's name and its page. */
export type CautionPlace = { label: string; href: string };

export function DeepTrenchCaution({ depth, trench }: { depth: number; trench?: CautionPlace }) {
  return (
    <div role="alert" className="rounded border-2 border-warn bg-warn-light p-3 text-warn">
      <p className="font-bold">
        Deep trench
        {trench ? (
          <>
            {" "}
            —{" "}
            <Link className="underline" href={trench.href}>
              {trench.label}
            </Link>
          </>
        ) : (
          ""
        )}
        : {depth.toFixed(2)} m below the ground surface, from the reduced levels recorded
      </p>
      <p className="text-sm">
        Beyond about {DEEP_TRENCH_M} m the sides need support, battering or stepping before anyone works in the trench.
        Follow the local regulations and the site&apos;s risk assessment; this figure is common practice, not a rule.
      </p>
    </div>
  );
}

export function HumanRemainsBanner({ count, finds = [] }: { count: number; finds?: CautionPlace[] }) {
  return (
    <div role="alert" className="rounded border-2 border-ink bg-ink p-3 text-paper">
      <p className="font-bold">Human remains recorded ({count})</p>
      {finds.length > 0 && (
        <ul className="my-1 flex flex-wrap gap-x-4 gap-y-1" aria-label="Where human remains were recorded">
          {finds.map((f) => (
            <li key={f.href}>
              <Link className="font-semibold underline" href={f.href}>
                {f.label}
              </Link>
            </li>
          ))}
          {count > finds.length && <li>and {count - finds.length} more</li>}
        </ul>
      )}
      <p className="text-sm">
        Work on remains stops until they are reported as the law of this place requires. The excavation licence and the
        local authority decide what happens next; record nothing further until they have.
      </p>
    </div>
  );
}
