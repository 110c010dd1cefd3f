/**
 * Importing a CSV file into a characteristic: stream → rows (./stream-table.ts) → typed rows (./rows.ts)
 * → subgroups (./assemble.ts) → stored subgroups (./write.ts), all inside ONE SQLite transaction opened
 * before the first row, so memory stays flat however long the file is and the outcome is all or nothing:
 * - "all-or-nothing": any problem anywhere rolls everything back; every problem is reported;
 * - "valid-only" (an explicit choice): valid subgroups are kept, rejected rows go to a downloadable file;
 * - dry run: the same work, always rolled back, so the counts reported are exactly what an import would do.
 * Problems of the whole file (not UTF-8, empty, bad header or mapping) stop it in every mode.
 * After the commit, the characteristic's signals are re-evaluated once for the whole batch (recorded).
 */
import type Database from "better-sqlite3";
import type { PrismaClient } from "@/src/db/connect";
import { getCharacteristic } from "@/src/characteristics/setup";
import { storedTime } from "@/src/db/stored-time";
import { enterWriteGate } from "@/src/db/write-gate";
import { AppError, parseInput } from "@/src/errors";
import type { CsvProblem } from "@/src/io/csv/errors";
import type { CsvSeparator } from "@/src/io/csv/read-table";
import { reevaluateSignals } from "@/src/signals";
import { zoneOfProcess } from "@/src/sites/zone";
import { createAssembler, type TRejectedRow } from "./assemble";
import { ZImportOptions, type TImportMode, type TImportOptionsInput } from "./options";
import { rejectedRowsCsv, writeRejectedRows } from "./rejected-rows";
import { checkMapping, createRowReader, type TParsedRow } from "./rows";
import { streamCsvRows } from "./stream-table";
import { completeBatch, createBatch, createSubgroupWriter } from "./write";

/** Problems listed in an answer; the total is always given. */
export const MAX_LISTED_PROBLEMS = 1000;

export interface TImportProgress {
  readonly bytesRead: number;
  readonly rowsRead: number;
}

export interface TImportRequest {
  readonly characteristicId: number;
  /** The file's bytes (a Node stream, a web stream or any async iterable of chunks). */
  readonly source: AsyncIterable<Uint8Array>;
  readonly options: TImportOptionsInput;
  readonly now: Date;
  readonly onProgress?: (progress: TImportProgress) => void;
}

export interface TImportResult {
  /** imported: committed; rejected: nothing written because of problems; checked: dry run, nothing written. */
  readonly status: "imported" | "rejected" | "checked";
  readonly mode: TImportMode;
  readonly fileName: string;
  readonly fileHash: string;
  readonly separator: CsvSeparator | null;
  readonly decimalMark: "." | "," | null;
  readonly rowsRead: number;
  readonly rowsRejected: number;
  readonly subgroupsAdded: number;
  readonly subgroupsAlreadyPresent: number;
  /** Sequences of the added subgroups, [first, last], or null when none were added. */
  readonly addedSequences: readonly [number, number] | null;
  /** Every problem, in file order, up to MAX_LISTED_PROBLEMS. */
  readonly problems: readonly CsvProblem[];
  readonly problemCount: number;
  readonly batchId: number | null;
  readonly hasRejectedRowsFile: boolean;
  /** Signals after the batch re-evaluation: those ending on an added point. Null when nothing was added. */
  readonly signalsRaised: number | null;
}

function isBusy(error: unknown): boolean {
  const code = (error as { code?: unknown } | null)?.code;
  return code === "SQLITE_BUSY" || code === "SQLITE_LOCKED";
}

export async function importCsv(db: PrismaClient, database: Database.Database, request: TImportRequest): Promise<TImportResult> {
  const options = parseInput(ZImportOptions, request.options, "import options");
  const { mapping, mode } = options;
  const characteristic = await getCharacteristic(db, request.characteristicId);
  const { chartType, subgroupSize } = characteristic;
  // Times without a zone in the site's zone: the characteristic's process → area → site.
  const timestampReading = { ...options, zone: options.siteZone ? await zoneOfProcess(db, characteristic.processId) : undefined };
  const createdAt = storedTime(request.now.toISOString());

  // The process's other writers wait at the gate until this transaction ends (src/db/write-gate.ts);
  // writers in other processes meet the busy timeout.
  let leaveGate: (() => void) | undefined = await enterWriteGate();
  const endTurn = () => {
    leaveGate?.();
    leaveGate = undefined;
  };
  try {
    database.exec("BEGIN IMMEDIATE");
  } catch (error) {
    endTurn();
    if (isBusy(error)) throw new AppError("conflict", "Another import or write to this database is in progress; try again when it has finished.");
    throw error;
  }

  const problems: CsvProblem[] = [];
  let problemCount = 0;
  const report = (found: readonly CsvProblem[]) => {
    problemCount += found.length;
    for (const problem of found) if (problems.length < MAX_LISTED_PROBLEMS) problems.push(problem);
  };
  const rejected: TRejectedRow[] = [];
  let rowsRejected = 0;
  let fileProblem = false;
  let header: readonly string[] = [];
  let separator: CsvSeparator | null = null;
  let readRow: ReturnType<typeof createRowReader> | undefined;
  let subgroupsAdded = 0;
  let subgroupsAlreadyPresent = 0;
  let lastAdded = -1;

  try {
    const batchId = createBatch(database, characteristic.id, options.fileName, mode, createdAt);
    const writer = createSubgroupWriter(database, characteristic.id, chartType, mapping.timestamp, batchId, createdAt);
    const rejectRows = (rows: readonly TRejectedRow[]) => {
      rowsRejected += rows.length;
      report(rows.flatMap((row) => row.problems));
      if (mode === "valid-only") rejected.push(...rows);
    };
    const assembler = createAssembler(mapping, chartType, subgroupSize, {
      accepted(subgroup) {
        const outcome = writer.write(subgroup);
        if (outcome.kind === "present") subgroupsAlreadyPresent += 1;
        else if (outcome.kind === "added") {
          subgroupsAdded += 1;
          lastAdded = outcome.sequence;
        } else rejectRows(subgroup.rows.map((row) => ({ line: row.line, written: row.written, problems: [{ ...outcome.problem, line: row.line }] })));
      },
      rejected: rejectRows,
    });
    const subgroupKey = mapping.subgroup?.toLowerCase();

    const summary = await streamCsvRows(request.source, {
      onHeader(columns, line, fileSeparator, headerProblems) {
        header = columns;
        separator = fileSeparator;
        const found = [...headerProblems, ...checkMapping(mapping, columns, line, chartType, subgroupSize)];
        if (found.length > 0) {
          fileProblem = true;
          report(found);
          return;
        }
        readRow = createRowReader(mapping, fileSeparator === ";", timestampReading);
      },
      onRow({ row, written, problems: shapeProblems }) {
        if (readRow === undefined) return;
        const label = subgroupKey === undefined ? undefined : row.cells[subgroupKey];
        let parsed: TParsedRow | undefined;
        let rowProblems = shapeProblems;
        if (shapeProblems.length === 0) {
          const result = readRow(row);
          if (result.ok) parsed = result.row;
          else rowProblems = result.problems;
        }
        assembler.push({ line: row.line, label, written, parsed, problems: rowProblems });
      },
      onProgress: request.onProgress,
    });
    assembler.end();
    writer.flush();
    const { rowsRead } = summary;
    if (summary.problems.length > 0) {
      fileProblem = true;
      report(summary.problems);
    } else if (readRow !== undefined && rowsRead === 0) {
      fileProblem = true;
      report([{ line: 1, message: "the file has a header but no data rows" }]);
    }

    const stop = fileProblem || (mode === "all-or-nothing" && problemCount > 0);
    const commit = !stop && !options.dryRun;
    const result: TImportResult = {
      status: stop ? "rejected" : options.dryRun ? "checked" : "imported",
      mode,
      fileName: options.fileName,
      fileHash: summary.fileHash,
      separator,
      decimalMark: separator === null ? null : separator === ";" ? "," : ".",
      rowsRead: fileProblem ? 0 : rowsRead,
      rowsRejected: fileProblem ? 0 : rowsRejected,
      subgroupsAdded: commit || options.dryRun ? subgroupsAdded : 0,
      subgroupsAlreadyPresent,
      addedSequences: commit && subgroupsAdded > 0 ? [writer.firstSequence, lastAdded] : null,
      problems: [...problems].sort((first, second) => first.line - second.line),
      problemCount,
      batchId: commit ? batchId : null,
      hasRejectedRowsFile: commit && rejected.length > 0,
      signalsRaised: null,
    };
    if (!commit) {
      database.exec("ROLLBACK");
      endTurn();
      return result;
    }
    completeBatch(database, batchId, summary.fileHash, { rowsRead, subgroupsAdded, subgroupsAlreadyPresent, rowsRejected });
    if (rejected.length > 0) await writeRejectedRows(database.name, batchId, rejectedRowsCsv(header, separator ?? ",", rejected));
    database.exec("COMMIT");
    endTurn();
    if (subgroupsAdded === 0) return result;
    await reevaluateSignals(db, characteristic.id, {
      trigger: "import",
      reason: `import #${batchId} of ${options.fileName}: ${subgroupsAdded} subgroups added`,
      requestedBy: "CSV import",
      now: request.now,
    });
    const signalsRaised = await db.signal.count({ where: { characteristicId: characteristic.id, endSequence: { gte: writer.firstSequence } } });
    return { ...result, signalsRaised };
  } finally {
    if (database.inTransaction) database.exec("ROLLBACK");
    endTurn();
  }
}
