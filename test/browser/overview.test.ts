// The first page of the production build, in headless Chromium, against a fresh database holding the
// demo plant: every demo characteristic is listed by process with its latest value and a drawn trend.
import { mkdir } from "node:fs/promises";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { SAFETY_CAUTION } from "@/shared/constants";
import { startApp, watchedPage, type RunningApp } from "./production-server";

// The four characteristics of the invented closure-moulding plant (DESIGN.md, "Demo scenario").
const DEMO_CHARACTERISTICS = [/closure weight/i, /cap height/i, /short-shot/i, /flash/i];

let app: RunningApp | undefined;
let page: Page;
const browserProblems: string[] = [];

beforeAll(async () => {
  app = await startApp("demo plant");
  page = await watchedPage(app, browserProblems);
  const response = await page.goto(app.baseUrl, { waitUntil: "networkidle" });
  expect(response?.status(), app.serverOutput()).toBe(200);
});

afterAll(async () => {
  await app?.stop();
});

describe("characteristics overview", () => {
  test("lists every demo characteristic under its process, with a latest value and a drawn trend", async () => {
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe("Characteristics");
    expect(await page.getByRole("heading", { level: 2 }).count()).toBeGreaterThanOrEqual(1);

    for (const name of DEMO_CHARACTERISTICS) {
      const card = page.locator("article.card").filter({ has: page.getByRole("heading", { level: 3, name }) });
      expect(await card.count(), `one card for ${name}`).toBe(1);
      const text = (await card.textContent()) ?? "";
      expect(text).toMatch(/Latest/);
      expect(text).not.toMatch(/No data yet/);
      expect(await card.locator("time").getAttribute("datetime")).toMatch(/^\d{4}-\d{2}-\d{2}T/);
      // Shown in the demo plant's zone, Europe/London, with its name.
      expect(await card.locator("time").textContent()).toMatch(/^\d{1,2} \w{3} \d{4}, \d\d:\d\d (GMT|BST)$/);
      expect(await card.locator("figcaption").textContent()).toMatch(/^Last \d+ values of the .+, from .+ to .+/);
      // Recharts draws the line as an SVG path once the client component has rendered.
      const line = card.locator(".sparkline-plot svg path.recharts-line-curve");
      expect(await line.count(), `trend line for ${name}`).toBe(1);
      expect(await line.getAttribute("d")).toMatch(/^M/);
      const importPath = await card.getByRole("link", { name: /^Import readings for / }).getAttribute("href");
      expect(importPath).toMatch(/^\/characteristics\/\d+\/import$/);
      expect((await fetch(`${app!.baseUrl}${importPath}`)).status, `no dead link for ${name}`).toBe(200);
    }
  });

  test("the site's time zone is shown in its form, with what it changes and what it does not", async () => {
    const zone = page.getByRole("combobox", { name: "Time zone of Tarnwick Demo Closures Plant" });
    expect(await zone.inputValue()).toBe("Europe/London");
    expect(await page.locator(`#${await zone.getAttribute("id")}-hint`).textContent()).toBe(
      "Now Europe/London. Display and entry only: stored times stay in UTC, and so do the API and CSV files.",
    );
  });

  test("every safety-related badge is described by the safety caution", async () => {
    const badges = page.locator(".badge-safety");
    // The demo plant marks at least one characteristic safety-related (src/demo).
    expect(await badges.count()).toBeGreaterThanOrEqual(1);
    for (let index = 0; index < (await badges.count()); index += 1) {
      const describedBy = await badges.nth(index).getAttribute("aria-describedby");
      expect(describedBy).toBeTruthy();
      expect(await page.locator(`#${describedBy}`).textContent()).toBe(SAFETY_CAUTION);
    }
  });

  test("the page loads without browser errors, and a screenshot is kept", async () => {
    const directory = path.join(process.cwd(), "test-results");
    await mkdir(directory, { recursive: true });
    await page.screenshot({ path: path.join(directory, "overview.png"), fullPage: true });
    expect(browserProblems).toEqual([]);
  });

  test("the first Tab reaches the skip link", async () => {
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe("Skip to content");
  });
});
