import { env } from "@/env";
import "@fontsource/jetbrains-mono/400.css";
import "@fontsource/jetbrains-mono/700.css";
import "./globals.css";
import type { Metadata, Viewport } from "next";
import { SiteHeader } from "@/components/site-header";

export function generateMetadata(): Metadata {
  return {
    // Link previews (a permalink's image) need absolute addresses: the app's own, from the environment.
    metadataBase: new URL(env().NEXTAUTH_URL),
    title: { default: "Framefork", template: "%s · Framefork" },
    icons: { icon: { url: "/icon.svg", type: "image/svg+xml" } },
    description:
      "Every string and stance cancel of a fighting-game character as a branching graph, with the frame advantage of every path.",
  };
}

export const viewport: Viewport = { themeColor: "#0b0d12", width: "device-width", initialScale: 1 };

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className="dark">
      <body>
        <a
          href="#main"
          className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-ink-800 focus:px-3 focus:py-2"
        >
          Skip to content
        </a>
        <SiteHeader />
        <main id="main" className="mx-auto w-full max-w-7xl px-4 py-6 sm:px-6">
          {children}
        </main>
      </body>
    </html>
  );
}
