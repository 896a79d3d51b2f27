import { signOutAction } from "@/app/sign-in/actions";
import { SignOutForm } from "./offline/sign-out-form";

/** The session is ended by a server action in app/, so no component imports the auth module. */
export function SignOutButton() {
  return <SignOutForm action={signOutAction} />;
}
