/** Depth beyond which trench sides need support or stepping: about 1.2 m (common practice; no single source). */
export const DEEP_TRENCH_M = 1.2;

export function DeepTrenchCaution({ depth }: { depth: number }) {
  return (
    <div role="alert" className="rounded border-2 border-warn bg-warn-light p-3 text-warn">
      <p className="font-bold">Deep trench: {depth.toFixed(2)} m below the ground surface, from the reduced levels recorded</p>
      <p className="text-sm">
        Beyond about {DEEP_TRENCH_M} m the sides need support, battering or stepping before anyone works in the trench. Follow the
        local regulations and the site&apos;s risk assessment; this figure is common practice, not a rule.
      </p>
    </div>
  );
}

export function HumanRemainsBanner({ count }: { count: number }) {
  return (
    <div role="alert" className="rounded border-2 border-ink bg-ink p-3 text-paper">
      <p className="font-bold">Human remains recorded ({count})</p>
      <p className="text-sm">
        Work on remains stops until they are reported as the law of this place requires. The excavation licence and the local
        authority decide what happens next; record nothing further until they have.
      </p>
    </div>
  );
}
