/**
 * Starts the production build (`next start`) on a free loopback port against a fresh temporary SQLite
 * database, either prepared by `npm run -s db:prepare` (migrations and the demo plant) or only migrated
 * (`npm run -s db:migrate`, an empty plant), and launches Debian's
 * Chromium through playwright-core with a fresh profile. `stop()` always ends both and removes the
 * temporary files.
 */
import { execFile, spawn, type ChildProcess } from "node:child_process";
import { existsSync } from "node:fs";
import { mkdtemp, rm } from "node:fs/promises";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { chromium, type BrowserContext, type Page } from "playwright-core";

const run = promisify(execFile);

const CHROMIUM = "/usr/bin/chromium";
const CHROMIUM_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];
const SERVER_READY_TIMEOUT_MS = 60_000;

export interface RunningApp {
  readonly baseUrl: string;
  readonly browser: BrowserContext;
  /** Everything the server printed, for failure messages. */
  serverOutput(): string;
  stop(): Promise<void>;
}

async function freeLoopbackPort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once("error", reject);
    probe.listen(0, "127.0.0.1", () => {
      const address = probe.address();
      probe.close(() => (typeof address === "object" && address !== null ? resolve(address.port) : reject(new Error("no port"))));
    });
  });
}

async function waitUntilServing(url: string, server: ChildProcess, output: () => string): Promise<void> {
  const deadline = Date.now() + SERVER_READY_TIMEOUT_MS;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`next start exited with ${server.exitCode}:\n${output()}`);
    try {
      const response = await fetch(url);
      if (response.ok) return;
    } catch {
      // Not listening yet.
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  throw new Error(`next start did not serve ${url} within ${SERVER_READY_TIMEOUT_MS / 1000} s:\n${output()}`);
}

/** Ends the server's whole process group: `next start` runs its server in child processes. */
async function stopServer(server: ChildProcess): Promise<void> {
  if (server.exitCode !== null || server.signalCode !== null || server.pid === undefined) return;
  const exited = new Promise((resolve) => server.once("exit", resolve));
  process.kill(-server.pid, "SIGTERM");
  const killTimer = setTimeout(() => {
    if (server.exitCode === null && server.pid !== undefined) process.kill(-server.pid, "SIGKILL");
  }, 5_000);
  await exited;
  clearTimeout(killTimer);
}

/** What the fresh database holds when the server starts. */
export type StartingData = "demo plant" | "empty";

const PREPARE_SCRIPT: Record<StartingData, string> = { "demo plant": "db:prepare", empty: "db:migrate" };

export async function startApp(startingData: StartingData): Promise<RunningApp> {
  const root = process.cwd();
  if (!existsSync(path.join(root, ".next", "BUILD_ID"))) {
    throw new Error("No production build in .next: run `npm run build` first (npm test does).");
  }
  if (!existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: apt-get install -y chromium (.ci/run does).`);

  const workDirectory = await mkdtemp(path.join(tmpdir(), "assignable-browser-"));
  const environment: NodeJS.ProcessEnv = {
    ...process.env,
    DATABASE_URL: `file:${path.join(workDirectory, "assignable.db")}`,
    NODE_ENV: "production",
  };
  let server: ChildProcess | undefined;
  let browser: BrowserContext | undefined;
  const stop = async () => {
    await browser?.close().catch(() => undefined);
    if (server !== undefined) await stopServer(server);
    await rm(workDirectory, { recursive: true, force: true });
  };

  try {
    await run("npm", ["run", "-s", PREPARE_SCRIPT[startingData]], { cwd: root, env: environment });

    const port = await freeLoopbackPort();
    let output = "";
    server = spawn(path.join(root, "node_modules", ".bin", "next"), ["start", "-H", "127.0.0.1", "-p", String(port)], {
      cwd: root,
      env: environment,
      detached: true,
      stdio: ["ignore", "pipe", "pipe"],
    });
    server.stdout?.on("data", (chunk: Buffer) => (output += chunk.toString()));
    server.stderr?.on("data", (chunk: Buffer) => (output += chunk.toString()));
    const baseUrl = `http://127.0.0.1:${port}`;
    await waitUntilServing(baseUrl, server, () => output);

    browser = await chromium.launchPersistentContext(path.join(workDirectory, "chromium-profile"), {
      executablePath: CHROMIUM,
      headless: true,
      args: CHROMIUM_ARGS,
    });
    return { baseUrl, browser, serverOutput: () => output, stop };
  } catch (error) {
    await stop();
    throw error;
  }
}

/** A new page that records console errors and uncaught page errors into `problems`. */
export async function watchedPage(
  app: RunningApp,
  problems: string[],
  viewport?: { width: number; height: number },
): Promise<Page> {
  const page = await app.browser.newPage();
  if (viewport !== undefined) await page.setViewportSize(viewport);
  page.on("console", (message) => {
    if (message.type() === "error") problems.push(`console: ${message.text()}`);
  });
  page.on("pageerror", (error) => problems.push(`page error: ${error.message}`));
  return page;
}
