import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { cookies } from "next/headers";
import { FIELD_MODE_COOKIE } from "@/components/ui/field-mode";
import "./globals.css";

const body = localFont({
  src: [
    { path: "./fonts/ibm-plex-sans-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/ibm-plex-sans-latin-500-normal.woff2", weight: "500", style: "normal" },
    { path: "./fonts/ibm-plex-sans-latin-600-normal.woff2", weight: "600", style: "normal" },
    { path: "./fonts/ibm-plex-sans-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-body",
  display: "swap",
});

const figures = localFont({
  src: [
    { path: "./fonts/ibm-plex-mono-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/ibm-plex-mono-latin-500-normal.woff2", weight: "500", style: "normal" },
  ],
  variable: "--font-figures",
  display: "swap",
});

export const metadata: Metadata = {
  title: { default: "Sortie", template: "%s · Sortie" },
  description: "Run debriefs for small remote vehicles: link, failsafe, route, battery and range.",
};

export const viewport: Viewport = {
  width: "device-width",
  initialScale: 1,
  themeColor: "#0d5c63",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Rendered on the server from the cookie, so field mode is there from the first paint.
  const fieldMode = (await cookies()).get(FIELD_MODE_COOKIE)?.value === "on";
  return (
    <html lang="en" className={`${body.variable} ${figures.variable}`} data-field-mode={fieldMode ? "on" : undefined}>
      <body className="min-h-dvh font-sans">{children}</body>
    </html>
  );
}
