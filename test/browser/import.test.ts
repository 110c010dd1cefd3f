// The CSV import through the browser, on the production build against a fresh demo plant: a continuation
// of the demo cap-height series with a planted shift (made by the demo generator, src/demo) is chosen,
// previewed, mapped and imported; the progress bar shows real progress; the summary reports the new
// subgroups and the signals they raised; the chart page then lists signals on the imported points.
import { mkdir, mkdtemp, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { DEFAULT_DEMO_SEED } from "@/src/demo/scenario";
import { capHeightCsv } from "../integration/imports/demo-continuation";
import { startApp, watchedPage, type RunningApp } from "./production-server";

/** Imported points, the last half shifted up by 2.5 demo sigmas (see capHeightCsv). */
const IMPORTED = 120;
const SHIFT_FROM = 60;

let app: RunningApp | undefined;
let page: Page;
let directory: string;
const browserProblems: string[] = [];

beforeAll(async () => {
  app = await startApp("demo plant");
  directory = await mkdtemp(path.join(os.tmpdir(), "assignable-import-browser-"));
  page = await watchedPage(app, browserProblems);
});

afterAll(async () => {
  await app?.stop();
  if (directory !== undefined) await rm(directory, { recursive: true, force: true });
});

/** The cap-height characteristic's id, from the API's list. */
async function capHeightId(baseUrl: string): Promise<number> {
  const response = await fetch(`${baseUrl}/api/v1/characteristics`);
  const body = (await response.json()) as { characteristics: { id: number; name: string }[] };
  const found = body.characteristics.find((characteristic) => /cap height/i.test(characteristic.name));
  if (found === undefined) throw new Error(`no cap height characteristic in ${JSON.stringify(body)}`);
  return found.id;
}

describe("CSV import in the browser", () => {
  test("a shifted continuation of the demo cap-height series is previewed, mapped, imported with a progress bar, and raises signals shown on the chart page", async () => {
    if (app === undefined) throw new Error("the app did not start");
    const id = await capHeightId(app.baseUrl);
    // Every imported time lies after the seeded history, which ends at the time of seeding.
    const continuation = capHeightCsv({ seed: DEFAULT_DEMO_SEED + 1, after: new Date(), count: IMPORTED, shiftFrom: SHIFT_FROM, shiftSigmas: 2.5 });
    const file = path.join(directory, "cap-height-continuation.csv");
    await writeFile(file, continuation.csv);

    const response = await page.goto(`${app.baseUrl}/characteristics/${id}/import`, { waitUntil: "networkidle" });
    expect(response?.status(), app.serverOutput()).toBe(200);
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toMatch(/cap height/i);

    await page.getByLabel("CSV file").setInputFiles(file);
    const preview = page.getByRole("table", { name: /the header and the first 10 rows/i });
    await preview.waitFor();
    expect(await preview.locator("tbody tr").count()).toBe(10);
    expect(await page.getByText(/Separator: comma/).count()).toBe(1);

    // The timestamp column is recognised by name; the value column is chosen by its label.
    expect(await page.getByLabel(/timestamp \(required\)/).inputValue()).toBe("timestamp");
    await page.getByLabel(/measured value \(required\)/).selectOption("cap height (mm)");
    expect(await page.getByLabel(/Keep “cavity” as a tag/).isChecked()).toBe(true);

    // Record every state of the progress bar while the import runs (a small file is quick).
    await page.evaluate(() => {
      const seen: { value: number; label: string }[] = [];
      (window as unknown as { progressSeen: typeof seen }).progressSeen = seen;
      new MutationObserver(() => {
        const bar = document.querySelector("progress");
        if (bar !== null) seen.push({ value: bar.value, label: document.querySelector(`label[for="${bar.id}"]`)?.textContent ?? "" });
      }).observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
    });
    await page.getByRole("button", { name: "Import", exact: true }).click();
    await mkdir(path.join(process.cwd(), "test-results"), { recursive: true });
    const summary = page.locator("#outcome-heading + p");
    await summary.waitFor({ timeout: 60_000 });
    const text = (await summary.textContent()) ?? "";
    expect(text, text).toMatch(new RegExp(`^Imported: ${IMPORTED} subgroups added, \\d+ signals? on the new points\\.$`));
    expect(Number(/(\d+) signals? on the new points/.exec(text)?.[1])).toBeGreaterThan(0);

    await page.screenshot({ path: path.join(process.cwd(), "test-results", "import.png"), fullPage: true });
    const progressSeen = await page.evaluate(() => (window as unknown as { progressSeen: { value: number; label: string }[] }).progressSeen);
    expect(progressSeen.length).toBeGreaterThan(0);
    expect(progressSeen.some(({ value, label }) => value > 0 && /^(Sending the file|Reading and checking rows): \d+%/.test(label))).toBe(true);
    expect(await page.getByRole("status").textContent()).toBe("Import finished");

    await page.getByRole("link", { name: "Open the chart" }).click();
    await page.waitForURL(new RegExp(`/characteristics/${id}$`));
    await page.waitForLoadState("networkidle");
    await page.screenshot({ path: path.join(process.cwd(), "test-results", "import-chart.png"), fullPage: true });
    expect(await page.getByRole("heading", { level: 1 }).textContent(), app.serverOutput()).toMatch(/cap height/i);
    // Signals listed on the chart page whose last point is one of the imported points.
    const listed = await page.locator(".signal-item").allTextContents();
    const firstImported = Number(/(\d[\d,]*) subgroups/.exec((await page.locator(".facts-line").textContent()) ?? "")?.[1]?.replaceAll(",", "")) - IMPORTED;
    const onImported = listed.filter((item) => {
      const range = /subgroups (\d+)–(\d+)/.exec(item);
      return range !== null && Number(range[2]) >= firstImported + SHIFT_FROM;
    });
    expect(onImported.length, listed.join("\n")).toBeGreaterThan(0);
    expect(browserProblems).toEqual([]);
  });
});
