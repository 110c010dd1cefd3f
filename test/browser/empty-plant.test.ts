// The first page of the production build against a migrated database with no characteristics yet.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, expect, test } from "vitest";
import { startApp, type RunningApp } from "./production-server";

let app: RunningApp | undefined;
let page: Page;

beforeAll(async () => {
  app = await startApp("empty");
  page = await app.browser.newPage();
});

afterAll(async () => {
  await app?.stop();
});

test("an empty plant shows what to do instead of an empty list", async () => {
  const response = await page.goto(app!.baseUrl);
  expect(response?.status(), app!.serverOutput()).toBe(200);
  expect(await page.getByRole("heading", { level: 2 }).textContent()).toBe("No characteristics recorded yet");
  expect(await page.locator("main").textContent()).toContain("npm run db:seed");
  expect(await page.locator("article.card").count()).toBe(0);
});
