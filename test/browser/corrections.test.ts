// Correcting a recorded value on the production build, in headless Chromium against a fresh demo plant:
// the closure-weight subgroup with the planted digit slip is corrected to the value meant, the answer says
// what changed and how the signals moved, and the correction is listed with the value as recorded.
// A correction without a reason is refused at its field and stores nothing.
import { mkdir } from "node:fs/promises";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { DEFAULT_DEMO_SEED, generateDemoScenario } from "@/src/demo/scenario";
import { startApp, watchedPage, type RunningApp } from "./production-server";

let app: RunningApp | undefined;
let page: Page;
const browserProblems: string[] = [];

// The slip as the scenario planted it (the same seed the demo plant is seeded with): which reading of
// which subgroup, the value meant and the value typed. The values do not depend on the end time.
const slip = generateDemoScenario({ seed: DEFAULT_DEMO_SEED, end: new Date() }).plantedEpisodes.find(
  (episode) => episode.kind === "digit-slip",
);

beforeAll(async () => {
  app = await startApp("demo plant");
  page = await watchedPage(app, browserProblems, { width: 1400, height: 1000 });
  const response = await page.goto(app.baseUrl, { waitUntil: "networkidle" });
  expect(response?.status(), app.serverOutput()).toBe(200);
});

afterAll(async () => {
  await app?.stop();
});

function escaped(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
}

describe("corrections page", () => {
  test("the chart page links to the corrections page, which lists no corrections yet", async () => {
    expect(slip?.slip).toBeDefined();
    await page.getByRole("link", { name: /closure weight/i }).first().click();
    await page.waitForURL(/\/characteristics\/\d+$/);
    await page.getByRole("link", { name: "Correct a recorded value" }).click();
    await page.waitForURL(/\/corrections$/);
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toMatch(/^Correct a recorded value: .*closure weight/i);
    expect(await page.getByText(/has been corrected/).textContent()).toMatch(/^No value of .* has been corrected\.$/);
  });

  test("a correction without a reason is refused at its field and nothing is stored", async () => {
    const { position, intended } = slip!.slip!;
    await page.getByLabel("Subgroup", { exact: true }).fill(String(slip!.first));
    await page.getByLabel("Value in the subgroup").fill(String(position + 1));
    await page.getByLabel(/^Corrected value/).fill(String(intended));
    await page.getByLabel("Corrected by").fill("Test inspector");
    await page.getByRole("button", { name: "Correct and re-evaluate" }).click();
    await page.locator("#field-reason-error").waitFor();
    expect(await page.locator("#field-reason-error").textContent()).toMatch(/^Reason for the correction must say why/);
    expect(await page.getByLabel("Reason for the correction").getAttribute("aria-invalid")).toBe("true");
    // What was typed stays beside the problem, and the list still has no correction.
    expect(await page.getByLabel("Corrected by").inputValue()).toBe("Test inspector");
    expect(await page.getByRole("table", { name: "Corrections" }).count()).toBe(0);
  });

  test("the planted digit slip is corrected: the answer in words, then the new row in the list", async () => {
    const { position, intended, typed } = slip!.slip!;
    await page.getByLabel("Reason for the correction").fill("First two decimals swapped when typed");
    await page.getByRole("button", { name: "Correct and re-evaluate" }).click();
    const answer = page.getByRole("status");
    await answer.waitFor();
    const text = (await answer.textContent()) ?? "";
    expect(text).toMatch(
      new RegExp(
        `^Subgroup ${slip!.first}, value ${position + 1}: ${escaped(String(typed))} → ${escaped(String(intended))} ` +
          `\\(recorded ${escaped(String(typed))}\\)\\. Signals re-evaluated: \\d+ before, \\d+ after\\.$`,
      ),
    );
    // The slip is far outside the range the other readings span, so it raised signals that the correction removes.
    const [, before, after] = /(\d+) before, (\d+) after/.exec(text) ?? [];
    expect(Number(after)).toBeLessThan(Number(before));
    const rows = page.getByRole("table", { name: "Corrections" }).locator("tbody tr");
    await rows.first().waitFor();
    expect(await rows.count()).toBe(1);
    expect(await rows.first().textContent()).toMatch(
      new RegExp(
        `^${slip!.first}value ${position + 1}${escaped(String(typed))} → ${escaped(String(intended))}` +
          // The demo plant is in Europe/London: the time is shown with GMT in winter, BST in summer.
          `First two decimals swapped when typedTest inspector\\d+ \\w+ \\d{4}, \\d\\d:\\d\\d (GMT|BST)$`,
      ),
    );
    const directory = path.join(process.cwd(), "test-results");
    await mkdir(directory, { recursive: true });
    await page.screenshot({ path: path.join(directory, "corrections.png"), fullPage: true });
  });

  test("no browser errors", () => {
    expect(browserProblems).toEqual([]);
  });
});
