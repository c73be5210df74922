import type { Metadata, Viewport } from "next";
import { headers } from "next/headers";
import "@fontsource-variable/inter";
import "./globals.css";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Benchwarden", template: "%s · Benchwarden" },
  description: "Plan a laser bench, predict the beam and its diffraction, assess the hazard, and get it signed off.",
  // public/icon.svg (our own mark) and public/manifest.webmanifest
  icons: { icon: [{ url: "/icon.svg", type: "image/svg+xml" }], apple: [{ url: "/icon.svg" }] },
  manifest: "/manifest.webmanifest",
};

export const viewport: Viewport = { themeColor: "#0e1316", width: "device-width", initialScale: 1 };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: Next.js puts proxy.ts's fresh CSP nonce on its scripts, which a
  // page prerendered at build time could not carry.
  await headers();
  return (
    <html lang="en">
      <body className="antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
