import type { Metadata } from "next";
import type { ReactNode } from "react";
import { Providers } from "@/components/providers";
import { mono, serif } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Loamwork", template: "%s · Loamwork" },
  description: "Record where finds come out of the ground, and test honestly how they are spread.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${serif.variable} ${mono.variable}`}>
      <body className="min-h-screen">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
