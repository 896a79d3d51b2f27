import { SiteNav } from "@/components/site-nav";
import { pageSiteActor } from "@/lib/server/page-access";
import { InvitationsPanel } from "./invitations-panel";
import { MembersPanel } from "./members-panel";

export default async function MembersPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { actor } = await pageSiteActor(siteId);
  return (
    <>
      <SiteNav siteId={siteId} role={actor.role} current={`/sites/${siteId}/members`} />
      <main className="mx-auto max-w-5xl px-4 py-6">
        <h1 className="text-3xl font-bold">People on this site</h1>
        <p className="mt-1 text-ink-soft">
          {actor.role === "director"
            ? "You can invite people, change roles and take people off the site. People join only by accepting the invitation mailed to them."
            : "Only a site director can change who is on the site."}
        </p>
        <div className="mt-4">
          <MembersPanel siteId={siteId} canManage={actor.role === "director"} selfId={actor.userId} />
        </div>
        {actor.role === "director" && (
          <div className="mt-8">
            <InvitationsPanel siteId={siteId} />
          </div>
        )}
      </main>
    </>
  );
}
