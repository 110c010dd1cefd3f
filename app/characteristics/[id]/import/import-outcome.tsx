"use client";
/** What an import or a check did: a one-line summary, the problems by line, and the next step. */
import Link from "next/link";
import type { TImportResult } from "@/src/imports/import-csv";
import styles from "./import.module.css";

interface ImportOutcomeProps {
  readonly characteristicId: number;
  readonly result: TImportResult;
  readonly busy: boolean;
  readonly onImportValidRows: () => void;
}

function plural(count: number, word: string): string {
  return `${count.toLocaleString("en")} ${word}${count === 1 ? "" : "s"}`;
}

function summary(result: TImportResult): string {
  const present = result.subgroupsAlreadyPresent > 0 ? `, ${plural(result.subgroupsAlreadyPresent, "subgroup")} already present` : "";
  switch (result.status) {
    case "imported": {
      const rejected = result.rowsRejected > 0 ? `, ${plural(result.rowsRejected, "row")} rejected` : "";
      const signals = result.signalsRaised === null ? "" : `, ${plural(result.signalsRaised, "signal")} on the new points`;
      return `Imported: ${plural(result.subgroupsAdded, "subgroup")} added${present}${rejected}${signals}.`;
    }
    case "checked":
      return result.problemCount === 0
        ? `The file is ready: ${plural(result.rowsRead, "row")} read; an import would add ${plural(result.subgroupsAdded, "subgroup")}${present}.`
        : `${plural(result.problemCount, "problem")} found in ${plural(result.rowsRead, "row")}. Nothing was written.`;
    case "rejected":
      return `Nothing was imported: the file has ${plural(result.problemCount, "problem")}.`;
  }
}

export function ImportOutcome({ characteristicId, result, busy, onImportValidRows }: ImportOutcomeProps) {
  const canKeepValidRows = result.status !== "imported" && result.problemCount > 0 && result.rowsRead > 0 && result.mode === "all-or-nothing";
  const chartLink = `/characteristics/${characteristicId}`;
  return (
    <section aria-labelledby="outcome-heading" className={styles.outcome} data-status={result.status}>
      <h2 id="outcome-heading">{result.status === "imported" ? "Import finished" : result.status === "checked" ? "Check finished" : "Import refused"}</h2>
      <p className={styles.summary}>{summary(result)}</p>
      {result.status === "imported" && (
        <p>
          <Link href={chartLink}>Open the chart</Link>
          {result.hasRejectedRowsFile && result.batchId !== null && (
            <>
              {" · "}
              <a href={`/api/v1/characteristics/${characteristicId}/imports/${result.batchId}/rejected`} download>
                Download the rejected rows (CSV with line and reason)
              </a>
            </>
          )}
        </p>
      )}
      {result.problems.length > 0 && (
        <>
          <table className={styles.problems}>
            <caption>
              Problems by line{result.problemCount > result.problems.length ? ` (the first ${result.problems.length.toLocaleString("en")} of ${result.problemCount.toLocaleString("en")})` : ""}
            </caption>
            <thead>
              <tr>
                <th scope="col">Line</th>
                <th scope="col">Column</th>
                <th scope="col">Problem</th>
              </tr>
            </thead>
            <tbody>
              {result.problems.map((problem, index) => (
                <tr key={`${problem.line}-${index}`}>
                  <td>{problem.line}</td>
                  <td>{problem.column ?? "—"}</td>
                  <td>{problem.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {canKeepValidRows && (
            <p>
              <button type="button" onClick={onImportValidRows} disabled={busy}>
                Import only the valid rows
              </button>{" "}
              <span className={styles.hint}>The rejected rows are kept as a file you can download, fix and import again.</span>
            </p>
          )}
        </>
      )}
    </section>
  );
}
