import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { invitationAcceptSchema, newPasswordSchema, type InvitationAccept } from "@/lib/schemas/account";
import type { Db } from "@/db/client";
import { invitations, memberships, sites, users, type Role } from "@/db/schema";
import { env } from "@/lib/env";
import { recordAudit } from "./audit";
import { badInput, conflict, notFound } from "./errors";
import { invitationMail } from "./mail/templates/invitation";
import { deliver, type Delivery } from "./mail/transport";
import type { SiteActor } from "./membership";
import { checkPassword, hashPassword } from "./passwords";
import { written } from "./written";

export { invitationAcceptSchema, newPasswordSchema, type InvitationAccept };

/** How long an invitation link works (common practice: about a week, long enough for a field season's post). */
export const INVITATION_DAYS = 7;

export const hashToken = (token: string) => createHash("sha256").update(token).digest("hex");
export const newToken = () => randomBytes(32).toString("base64url");

export const inviteLink = (token: string) => `${env().APP_URL}/invite/${token}`;

/** Sends an invitation to join the site in a role; an earlier pending one to the same address is replaced. */
export async function createInvitation(db: Db, actor: SiteActor, input: { email: string; role: Role }) {
  const token = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 24 * 3600_000);
  const row = await db.transaction(async (tx) => {
    const [member] = await tx
      .select({ name: users.name, role: memberships.role })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.siteId, actor.site.id), eq(users.email, input.email)));
    if (member) throw conflict(`${member.name} (${input.email}) is already on this site as ${member.role}.`);
    await tx
      .delete(invitations)
      .where(
        and(eq(invitations.siteId, actor.site.id), eq(invitations.email, input.email), isNull(invitations.acceptedAt)),
      );
    const inv = written(
      await tx
        .insert(invitations)
        .values({
          siteId: actor.site.id,
          email: input.email,
          role: input.role,
          tokenHash: hashToken(token),
          invitedBy: actor.userId,
          expiresAt,
        })
        .returning(),
      "The invitation",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "invite",
      recordType: "member",
      recordId: inv.id,
      after: publicInvitation(inv),
    });
    return inv;
  });
  const [inviter] = await db.select({ name: users.name }).from(users).where(eq(users.id, actor.userId));
  const mail: Delivery = await deliver([input.email], () =>
    invitationMail({
      siteCode: actor.site.code,
      siteName: actor.site.name,
      role: input.role,
      invitedBy: inviter?.name ?? "A site director",
      link: inviteLink(token),
      expiresAt,
    }),
  );
  return { invitation: publicInvitation(row), mail };
}

function publicInvitation(inv: typeof invitations.$inferSelect) {
  const { tokenHash: _h, ...rest } = inv;
  return rest;
}

/** The site's invitations, newest first, without their token hashes. */
export async function listInvitations(db: Db, siteId: string) {
  const rows = await db
    .select({ inv: invitations, invitedBy: users.name })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.siteId, siteId))
    .orderBy(desc(invitations.createdAt))
    .limit(100);
  const now = Date.now();
  return rows.map(({ inv, invitedBy }) => ({
    ...publicInvitation(inv),
    invitedByName: invitedBy,
    status: inv.acceptedAt
      ? ("accepted" as const)
      : inv.expiresAt.getTime() < now
        ? ("expired" as const)
        : ("pending" as const),
  }));
}

export async function revokeInvitation(db: Db, actor: SiteActor, invitationId: string) {
  return db.transaction(async (tx) => {
    const [inv] = await tx
      .select()
      .from(invitations)
      .where(and(eq(invitations.siteId, actor.site.id), eq(invitations.id, invitationId)));
    if (!inv) throw notFound("That invitation");
    if (inv.acceptedAt)
      throw conflict(`${inv.email} has already accepted; take them off the site on the People page instead.`);
    await tx.delete(invitations).where(eq(invitations.id, invitationId));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "revoke-invite",
      recordType: "member",
      recordId: inv.id,
      before: publicInvitation(inv),
    });
    return { revoked: invitationId };
  });
}

/** What the invitation page shows: the site, the role, who invited, whether the address has an account. */
export async function readInvitation(db: Db, token: string) {
  const [row] = await db
    .select({ inv: invitations, site: { id: sites.id, code: sites.code, name: sites.name }, invitedBy: users.name })
    .from(invitations)
    .innerJoin(sites, eq(sites.id, invitations.siteId))
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.tokenHash, hashToken(token)));
  if (!row) return { status: "unknown" as const };
  const [account] = await db.select({ id: users.id }).from(users).where(eq(users.email, row.inv.email));
  const status = row.inv.acceptedAt
    ? ("accepted" as const)
    : row.inv.expiresAt.getTime() < Date.now()
      ? ("expired" as const)
      : ("pending" as const);
  return {
    status,
    email: row.inv.email,
    role: row.inv.role,
    site: row.site,
    invitedBy: row.invitedBy ?? "a site director",
    expiresAt: row.inv.expiresAt,
    hasAccount: !!account,
  };
}

/**
 * Accepts an invitation: a new person chooses a name and password; someone with an account proves it with
 * their password. Either way they join the site in the invited role, once.
 */
export async function acceptInvitation(db: Db, input: InvitationAccept) {
  return db.transaction(async (tx) => {
    const [inv] = await tx
      .select()
      .from(invitations)
      .where(
        and(
          eq(invitations.tokenHash, hashToken(input.token)),
          isNull(invitations.acceptedAt),
          gt(invitations.expiresAt, new Date()),
        ),
      )
      .for("update");
    if (!inv)
      throw conflict("This invitation link has expired or has already been used; ask the site director for a new one.");
    const [known] = await tx.select().from(users).where(eq(users.email, inv.email));
    let user = known;
    if (user) {
      if (!(await checkPassword(input.password, user.passwordHash)))
        throw badInput("That is not the password of your Loamwork account.", { password: ["Wrong password."] });
    } else {
      if (!input.name)
        throw badInput("Give your name as it should appear on the record.", { name: ["Enter your name."] });
      const pw = newPasswordSchema.safeParse(input.password);
      if (!pw.success) {
        const message = pw.error.issues[0]?.message ?? "Choose another password.";
        throw badInput(message, { password: [message] });
      }
      user = written(
        await tx
          .insert(users)
          .values({ email: inv.email, name: input.name, passwordHash: await hashPassword(input.password) })
          .returning(),
        "The account",
      );
    }
    const [already] = await tx
      .select()
      .from(memberships)
      .where(and(eq(memberships.siteId, inv.siteId), eq(memberships.userId, user.id)));
    if (!already) {
      const [m] = await tx
        .insert(memberships)
        .values({ siteId: inv.siteId, userId: user.id, role: inv.role })
        .returning();
      await recordAudit(tx, {
        siteId: inv.siteId,
        actorId: user.id,
        action: "join",
        recordType: "member",
        recordId: user.id,
        after: { ...m, invitationId: inv.id },
      });
    }
    await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, inv.id));
    return { siteId: inv.siteId, email: user.email, role: already?.role ?? inv.role };
  });
}
