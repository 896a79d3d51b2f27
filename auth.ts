import "next-auth/jwt";
import NextAuth from "next-auth";
import Credentials from "next-auth/providers/credentials";
import { env } from "@/lib/env";
import { verifySignIn } from "@/lib/server/sign-in";
import { endSessions, sessionIsCurrent } from "@/lib/server/session-version";
import { forgetSignInTries } from "@/lib/server/sign-in-limit";
import { getDb } from "@/db/client";

declare module "next-auth" {
  interface User {
    sessionVersion?: number;
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    uid?: string;
    /** The account's session version at sign-in (lib/server/session-version.ts). */
    sv?: number;
  }
}

export const { handlers, auth, signIn, signOut } = NextAuth({
  secret: env().AUTH_SECRET,
  trustHost: true,
  session: { strategy: "jwt" },
  pages: { signIn: "/sign-in" },
  providers: [
    Credentials({
      credentials: { email: { label: "E-mail" }, password: { label: "Password", type: "password" } },
      // Tries are counted and limited before this runs (admitSignIn, at the sign-in route and form).
      authorize: async (credentials, request) => {
        const user = await verifySignIn(credentials);
        if (user) await forgetSignInTries(user.email, request.headers);
        return user;
      },
    }),
  ],
  callbacks: {
    // Runs on sign-in and on every read of the session (auth(), /api/auth/session): a session whose account
    // has since signed out or reset its password is refused here, and its cookie cleared.
    async jwt({ token, user }) {
      if (user?.id) {
        token.uid = user.id;
        token.sv = user.sessionVersion;
        return token;
      }
      return (await sessionIsCurrent(token.uid, token.sv)) ? token : null;
    },
    session({ session, token }) {
      if (token.uid && session.user) session.user.id = token.uid;
      return session;
    },
  },
  events: {
    // Signing out ends the session for everyone holding a copy of its cookie, not only in this browser.
    async signOut(message) {
      const uid = "token" in message ? message.token?.uid : undefined;
      if (uid) await endSessions(await getDb(), uid);
    },
  },
});
