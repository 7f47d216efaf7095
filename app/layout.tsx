import type { Metadata } from "next";
import type { ReactNode } from "react";
import { inter } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Bandkeep", template: "%s · Bandkeep" },
  description: "Spectral data repository with automated band-change detection for nanocrystal labs.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={inter.variable}>
      <body className="min-h-screen font-sans">{children}</body>
    </html>
  );
}
