import type { Metadata } from "next";
import { cookies } from "next/headers";
import { connection } from "next/server";
import type { ReactNode } from "react";
import { Providers } from "@/components/providers";
import { FIELD_MODE_COOKIE } from "@/lib/field-mode";
import { requestLocale } from "@/lib/server/request-locale";
import { mono, serif } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Loamwork", template: "%s · Loamwork" },
  description: "Record where finds come out of the ground, and test honestly how they are spread.",
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  // Every page is rendered per request: its scripts must carry this request's CSP nonce (see proxy.ts).
  await connection();
  const locale = await requestLocale();
  // Field mode is drawn by the server from its cookie, so a page never flashes the paper theme first.
  const field = (await cookies()).get(FIELD_MODE_COOKIE)?.value === "on";
  return (
    <html lang="en" className={`${serif.variable} ${mono.variable}`} data-field-mode={field ? "on" : undefined}>
      <body className="min-h-screen">
        <Providers locale={locale}>{children}</Providers>
      </body>
    </html>
  );
}
