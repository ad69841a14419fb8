import type { Metadata } from "next";
import type { ReactNode } from "react";
import { sans } from "@/components/ui/fonts";
import { AppProviders } from "@/components/providers/app-providers";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Halfmax", template: "%s · Halfmax" },
  description: "Spatial-resolution QA for imaging scanners: FWHM, MTF and trends against each scanner's baseline.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={sans.variable}>
      <body className="min-h-screen bg-surface-canvas font-sans text-body text-ink antialiased">
        <AppProviders>{children}</AppProviders>
      </body>
    </html>
  );
}
