import type { ReactNode } from "react";
import { AppHeader } from "@/components/app-header";
import { recorders } from "@/lib/api/operation";
import { isRole } from "@/lib/server/membership";
import { pageSiteActor } from "@/lib/server/page-access";

export default async function SiteLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ siteId: string }>;
}) {
  const { siteId } = await params;
  const { actor, userName } = await pageSiteActor(siteId);
  return (
    <>
      <AppHeader
        userName={userName}
        crumbs={[{ href: `/sites/${siteId}`, label: `${actor.site.code} ${actor.site.name}` }]}
        device={{ userId: actor.userId, siteId, canRecord: isRole(actor, recorders) }}
      />
      {children}
    </>
  );
}
