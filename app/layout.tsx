import type { Metadata } from "next";
import type { ReactNode } from "react";
import { merriweather, merriweatherExt } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Cellwright", template: "%s · Cellwright" },
  description: "Test procedures, runs and certificates for rechargeable lithium cells.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${merriweather.variable} ${merriweatherExt.variable}`}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
