import type { Metadata } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import "./globals.css";

export const metadata: Metadata = {
  title: "Assignable",
  description: "Control-chart signals carried from triage to a statistically verified return to control.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <body>
        <a className="skip-link" href="#main">
          Skip to content
        </a>
        <header className="site-header">
          <p className="product-name">
            <Link href="/">Assignable</Link>
          </p>
          <nav aria-label="Main">
            <ul>
              <li>
                <Link href="/">Characteristics</Link>
              </li>
            </ul>
          </nav>
        </header>
        <main id="main" tabIndex={-1}>
          {children}
        </main>
      </body>
    </html>
  );
}
