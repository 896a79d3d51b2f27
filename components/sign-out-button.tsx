import { signOut } from "@/auth";
import { SignOutForm } from "./offline/sign-out-form";

export function SignOutButton() {
  return (
    <SignOutForm
      action={async () => {
        "use server";
        await signOut({ redirectTo: "/sign-in" });
      }}
    />
  );
}
