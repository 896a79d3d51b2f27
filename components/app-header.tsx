import Link from "next/link";
import { FieldModeButton } from "./field-mode";
import { DeviceStatus } from "./offline/device-status";
import { SignOutButton } from "./sign-out-button";

/** The device's state (online, offline, sending, what waits) sits beside the user: their outbox is theirs. */
type DeviceProps = { userId: string; siteId?: string; canRecord?: boolean };

export function AppHeader({
  userName,
  crumbs = [],
  device,
}: {
  userName: string;
  crumbs?: { href: string; label: string }[];
  device?: DeviceProps;
}) {
  return (
    <header className="no-print border-b-2 border-ink/70 bg-paper-deep">
      <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-3 px-4 py-2">
        <Link href="/sites" className="font-mono text-lg font-semibold tracking-tight text-ink">
          loam<span className="text-accent">work</span>
        </Link>
        <nav aria-label="Where you are" className="flex flex-wrap items-center gap-1 text-ink-soft">
          {crumbs.map((c) => (
            <span key={c.href} className="flex items-center gap-1">
              <span aria-hidden>/</span>
              <Link className="underline decoration-ink/30 underline-offset-4 hover:text-ink" href={c.href}>
                {c.label}
              </Link>
            </span>
          ))}
        </nav>
        {/* On a phone the header's buttons wrap onto a second row rather than push the page sideways. */}
        <div className="ml-auto flex flex-wrap items-center justify-end gap-2 sm:gap-3">
          <Link href="/scan" className="btn">
            Scan a label
          </Link>
          {device && (
            <DeviceStatus
              userId={device.userId}
              siteId={device.siteId ?? null}
              canRecord={device.canRecord ?? false}
              renderedAt={new Date().toISOString()}
            />
          )}
          <FieldModeButton />
          <span className="text-sm text-ink-soft">{userName}</span>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
