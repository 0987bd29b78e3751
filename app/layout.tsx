import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { connection } from "next/server";
import "./globals.css";

const inter = localFont({
  src: [
    { path: "./fonts/inter-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/inter-latin-500-normal.woff2", weight: "500", style: "normal" },
    { path: "./fonts/inter-latin-600-normal.woff2", weight: "600", style: "normal" },
    { path: "./fonts/inter-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-inter",
  display: "swap",
});

// Δ and the other Greek letters the trade writes; the browser falls back to it glyph by glyph.
const interGreek = localFont({
  src: [
    { path: "./fonts/inter-greek-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/inter-greek-600-normal.woff2", weight: "600", style: "normal" },
  ],
  variable: "--font-inter-greek",
  display: "swap",
});

export const metadata: Metadata = {
  title: { default: "Heatpath", template: "%s · Heatpath" },
  description: "Temperature-corrected reaction thermodynamics for process engineers.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1 };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: Next puts the request's CSP nonce (proxy.ts) on its
  // scripts only while rendering, so a page built ahead of time would be blocked.
  await connection();
  return (
    <html lang="en" className={`${inter.variable} ${interGreek.variable}`}>
      <body>{children}</body>
    </html>
  );
}
