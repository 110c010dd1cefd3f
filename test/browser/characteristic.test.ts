// A demo characteristic's page on the production build, in headless Chromium against a fresh demo plant:
// the verdict above the chart, the chart with its signal markers and limit lines, the limit versions
// table; then one subgroup entered by hand, far outside the limits, answered at once with the rule in words.
import { mkdir } from "node:fs/promises";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { startApp, watchedPage, type RunningApp } from "./production-server";

let app: RunningApp | undefined;
let page: Page;
const browserProblems: string[] = [];

beforeAll(async () => {
  app = await startApp("demo plant");
  page = await watchedPage(app, browserProblems, { width: 1600, height: 1000 });
  const response = await page.goto(app.baseUrl, { waitUntil: "networkidle" });
  expect(response?.status(), app.serverOutput()).toBe(200);
});

afterAll(async () => {
  await app?.stop();
});

describe("characteristic page", () => {
  test("the overview links to the chart page, which answers first, then draws the chart with signals and the limit versions", async () => {
    await page.getByRole("link", { name: /closure weight/i }).first().click();
    await page.waitForURL(/\/characteristics\/\d+$/);
    await page.waitForLoadState("networkidle");
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toMatch(/closure weight/i);
    // The verdict comes before the chart, in words.
    const verdict = (await page.locator(".verdict-headline").textContent()) ?? "";
    expect(verdict).toMatch(/^(In control|Out of control)/);
    expect(await page.locator(".verdict-detail").textContent()).toMatch(/open signals?, latest: .+ \((we|nelson)-\d\) at /);
    // Recharts has drawn the points, the stepped limits and at least one signal triangle.
    // Attached, not "visible": a flat limit line has an empty bounding box.
    await page.locator(".chart-panel svg .recharts-line-curve").first().waitFor({ state: "attached" });
    expect(await page.locator(".chart-panel").count()).toBe(2);
    expect(await page.locator(".chart-panel").first().locator(".recharts-line-curve").count()).toBeGreaterThanOrEqual(6);
    expect(await page.locator(".chart-signals .recharts-symbols").count()).toBeGreaterThan(0);
    // Limit versions: which version applied to which points.
    const versions = page.getByRole("table", { name: "Limit versions" });
    expect(await versions.locator("tbody tr").count()).toBeGreaterThanOrEqual(1);
    expect(await versions.locator("tbody tr").first().textContent()).toMatch(/v1\s*0 onwards/);
    expect(await page.locator(".signal-list li").count()).toBeGreaterThan(0);
    const directory = path.join(process.cwd(), "test-results");
    await mkdir(directory, { recursive: true });
    await page.screenshot({ path: path.join(directory, "characteristic.png"), fullPage: true });
    await page.screenshot({ path: path.join(directory, "characteristic-top.png") });
  });

  test("zooming refetches decimated data for the chosen range", async () => {
    await page.getByRole("button", { name: "Last 100" }).click();
    await expect.poll(async () => page.locator(".chart-status").textContent()).toMatch(/^Subgroups \d+–\d+ of 0–\d+/);
    const status = (await page.locator(".chart-status").textContent()) ?? "";
    const [, from, to] = /^Subgroups (\d+)–(\d+)/.exec(status) ?? [];
    expect(Number(to) - Number(from)).toBe(99);
  });

  test("a subgroup entered by hand far above the limits is answered at once with the rule in words", async () => {
    await page.getByRole("link", { name: "Enter a subgroup" }).click();
    await page.waitForURL(/\/entry$/);
    // The time is typed as wall-clock time in the demo plant's zone, which the field names.
    const time = page.getByLabel("Time (Europe/London)");
    expect(await time.inputValue()).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d$/);
    expect(await page.locator(`#${await time.getAttribute("id")}-hint`).textContent()).toBe(
      "Wall-clock time in Europe/London, the plant's time zone; stored in UTC.",
    );
    const inputs = page.locator('input[name^="values."]');
    const count = await inputs.count();
    expect(count).toBeGreaterThanOrEqual(1);
    for (let index = 0; index < count; index++) await inputs.nth(index).fill("2,9");
    await page.getByRole("button", { name: "Store and check" }).click();
    const outcome = page.locator(".outcome");
    await outcome.waitFor();
    expect(await outcome.textContent()).toMatch(/Out of control at subgroup \d+\..*Rule fired: 1 point beyond the control limits \((we|nelson)-1\)/);
    await page.screenshot({ path: path.join(process.cwd(), "test-results", "entry.png"), fullPage: true });
  });

  test("a value that is not a number is named at its field and nothing is stored", async () => {
    await page.locator('input[name="values.0"]').fill("two");
    await page.getByRole("button", { name: "Store and check" }).click();
    await page.locator(".field-error").first().waitFor();
    expect(await page.locator(".field-error").first().textContent()).toMatch(/^Value( 1)? \(g\) must be a number/);
    expect(await page.locator('input[name="values.0"]').getAttribute("aria-invalid")).toBe("true");
    // What was typed stays in the form beside its problem.
    expect(await page.locator('input[name="values.0"]').inputValue()).toBe("two");
  });

  test("a new limit version needs a reason; with one it is saved and the chart page lists which points it applies to", async () => {
    await page.getByRole("link", { name: /Back to the chart/ }).click();
    await page.getByRole("link", { name: "Settings and limits" }).click();
    await page.waitForURL(/\/settings$/);
    await page.getByLabel("Baseline: first subgroup").fill("200");
    await page.getByLabel("Baseline: last subgroup").fill("299");
    await page.getByLabel("Subgroups left out of the baseline (optional)").fill("250: gauge dropped, value not trusted");
    await page.getByLabel("Approved by").fill("Test lead");
    await page.getByRole("button", { name: "Compute and freeze new limits" }).click();
    await page.locator("#field-reason-error").waitFor();
    expect(await page.locator("#field-reason-error").textContent()).toMatch(/^Reason for the new version must say why/);
    // What was typed is still there; only the reason is missing.
    expect(await page.getByLabel("Approved by").inputValue()).toBe("Test lead");
    await page.getByLabel("Reason for the new version").fill("New baseline after the mould service");
    await page.getByRole("button", { name: "Compute and freeze new limits" }).click();
    await expect.poll(async () => page.getByRole("status").first().textContent()).toMatch(/Limit version 2 saved/);
    await page.getByRole("link", { name: /Back to the chart/ }).click();
    await page.waitForURL(/\/characteristics\/\d+$/);
    const rows = page.getByRole("table", { name: "Limit versions" }).locator("tbody tr");
    await rows.nth(1).waitFor();
    expect(await rows.count()).toBe(2);
    expect(await rows.nth(0).textContent()).toMatch(/v1\s*0–199/);
    expect(await rows.nth(1).textContent()).toMatch(/v2\s*200 onwards.*left out 250: gauge dropped.*New baseline after the mould service/);
  });

  test("no browser errors", () => {
    expect(browserProblems).toEqual([]);
  });
});
