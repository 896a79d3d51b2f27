import type { Metadata } from "next";
import { AppHeader } from "@/components/app-header";
import { LabelScanner } from "@/components/labels/label-scanner";
import { pageUser } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Scan a label" };

export default async function ScanPage() {
  const { user } = await pageUser();
  return (
    <>
      <AppHeader userName={user.name} device={{ userId: user.id }} />
      <main className="mx-auto max-w-3xl space-y-4 px-4 py-6">
        <h1 className="text-3xl font-bold">Scan a label</h1>
        <p className="text-ink-soft">Point the camera at a bag or box label&apos;s code; the find or sample opens.</p>
        <LabelScanner />
      </main>
    </>
  );
}
