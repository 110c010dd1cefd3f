/** Fresh directories under the system temporary directory, removed after each test file. */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll } from "vitest";

export function registerTemporaryDirectories(): (label: string) => string {
  const created: string[] = [];
  afterAll(() => {
    for (const directory of created) rmSync(directory, { recursive: true, force: true });
  });
  return (label) => {
    const directory = mkdtempSync(path.join(os.tmpdir(), `assignable-${label}-`));
    created.push(directory);
    return directory;
  };
}
