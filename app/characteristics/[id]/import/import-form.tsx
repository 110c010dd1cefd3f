"use client";
/**
 * The import workflow: choose a file → preview of its first rows as parsed, with separator and decimal
 * mark → column mapping and time choices → check (a dry run on the server) or import, with a progress
 * bar fed by the real upload and reading progress → the outcome.
 */
import { useState } from "react";
import type { ChartType } from "@/shared/constants";
import type { TImportResult } from "@/src/imports/import-csv";
import type { TColumnMapping, TDayMonthOrder, TImportMode } from "@/src/imports/options";
import styles from "./import.module.css";
import { ImportOutcome } from "./import-outcome";
import { MappingFields } from "./mapping-fields";
import { guessMapping, previewFile, PREVIEW_ROWS, type TFilePreview } from "./preview";
import { sendFile, type TSendProgress } from "./send-file";

interface ImportFormProps {
  readonly characteristic: { readonly id: number; readonly name: string; readonly chartType: ChartType; readonly subgroupSize: number };
  /** The site's time zone (IANA name or "UTC"). */
  readonly zone: string;
}

/** The times select's value for "in the site's zone"; "" is "not stated", any other value one of OFFSETS. */
const SITE_ZONE = "site";

const OFFSETS = ["Z", ...Array.from({ length: 27 }, (_, index) => index - 12).filter((hours) => hours !== 0).map((hours) => `${hours < 0 ? "-" : "+"}${String(Math.abs(hours)).padStart(2, "0")}:00`), "+05:30"].sort(
  (a, b) => offsetMinutes(a) - offsetMinutes(b),
);

function offsetMinutes(offset: string): number {
  if (offset === "Z") return 0;
  return (offset.startsWith("-") ? -1 : 1) * (Number(offset.slice(1, 3)) * 60 + Number(offset.slice(4, 6)));
}

function megabytes(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

function progressText(progress: TSendProgress): { fraction: number; text: string } {
  if (progress.phase === "uploading") {
    const fraction = progress.total > 0 ? progress.loaded / progress.total : 0;
    return { fraction: fraction / 2, text: `Sending the file: ${Math.floor(fraction * 100)}% (${megabytes(progress.loaded)} of ${megabytes(progress.total)})` };
  }
  const fraction = progress.totalBytes > 0 ? progress.bytesRead / progress.totalBytes : 1;
  return { fraction: 0.5 + fraction / 2, text: `Reading and checking rows: ${Math.floor(fraction * 100)}% (${progress.rowsRead.toLocaleString("en")} rows)` };
}

export function ImportForm({ characteristic, zone }: ImportFormProps) {
  const [file, setFile] = useState<File | undefined>();
  const [preview, setPreview] = useState<TFilePreview | undefined>();
  const [mapping, setMapping] = useState<TColumnMapping | undefined>();
  // A plant whose clocks follow summer time exports wall-clock time: read it in the zone unless told otherwise.
  const [zoneless, setZoneless] = useState(zone === "UTC" ? "" : SITE_ZONE);
  const [dayMonthOrder, setDayMonthOrder] = useState<"" | TDayMonthOrder>("");
  const [progress, setProgress] = useState<{ fraction: number; text: string } | undefined>();
  const [announcement, setAnnouncement] = useState("");
  const [result, setResult] = useState<TImportResult | undefined>();
  const [failure, setFailure] = useState<{ message: string; issues: readonly { path: string; message: string }[] } | undefined>();
  const busy = progress !== undefined;

  async function choose(chosen: File | undefined) {
    setFile(chosen);
    setResult(undefined);
    setFailure(undefined);
    if (chosen === undefined) return setPreview(undefined);
    const read = await previewFile(chosen);
    setPreview(read);
    setMapping(guessMapping(read.header, characteristic.chartType, characteristic.subgroupSize));
  }

  async function run(dryRun: boolean, mode: TImportMode) {
    if (file === undefined || mapping === undefined) return;
    setResult(undefined);
    setFailure(undefined);
    setProgress({ fraction: 0, text: "Starting" });
    setAnnouncement(dryRun ? "Checking the file" : "Importing the file");
    let lastDecile = -1;
    const outcome = await sendFile(
      characteristic.id,
      file,
      {
        mapping,
        mode,
        dryRun,
        fileName: file.name,
        ...(zoneless === SITE_ZONE ? { siteZone: true } : zoneless === "" ? {} : { utcOffset: zoneless }),
        ...(dayMonthOrder === "" ? {} : { dayMonthOrder }),
      },
      (update) => {
        const shown = progressText(update);
        setProgress(shown);
        const decile = Math.floor(shown.fraction * 10);
        if (decile !== lastDecile) {
          lastDecile = decile;
          setAnnouncement(`${Math.round(shown.fraction * 100)}% done`);
        }
      },
    );
    setProgress(undefined);
    if (outcome.ok) {
      setResult(outcome.result);
      setAnnouncement(outcome.result.status === "imported" ? "Import finished" : outcome.result.status === "checked" ? "Check finished" : "Import refused");
    } else {
      setFailure(outcome);
      setAnnouncement("The server refused the request");
    }
  }

  return (
    <div className={styles.workflow}>
      <p className={styles.field}>
        <label htmlFor="import-file">CSV file</label>
        <input id="import-file" type="file" accept=".csv,text/csv,text/plain" onChange={(event) => void choose(event.target.files?.[0])} disabled={busy} />
      </p>

      {preview !== undefined && mapping !== undefined && (
        <>
          <section aria-labelledby="preview-heading">
            <h2 id="preview-heading">First rows as read</h2>
            <p>
              Separator: <strong>{preview.separator === ";" ? "semicolon (;)" : "comma (,)"}</strong>. Decimal mark:{" "}
              <strong>{preview.decimalMark === "," ? "comma (1,5) or point (1.5)" : "point (1.5)"}</strong>
              {preview.separator === "," ? " — a decimal comma needs semicolon-separated columns." : preview.decimalCommaSeen ? " — decimal commas seen in these rows." : "."}
            </p>
            <div className={styles.scroll}>
              <table className={styles.preview}>
                <caption>The header and the first {Math.min(PREVIEW_ROWS, preview.rows.length)} rows of {file?.name}</caption>
                <thead>
                  <tr>
                    {preview.header.map((column, index) => (
                      <th key={`${column}-${index}`} scope="col">
                        {column}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {preview.rows.map((row, rowIndex) => (
                    <tr key={rowIndex}>
                      {row.map((cell, cellIndex) => (
                        <td key={cellIndex}>{cell}</td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </section>

          <MappingFields header={preview.header} chart={characteristic.chartType} subgroupSize={characteristic.subgroupSize} mapping={mapping} onChange={setMapping} />

          <fieldset className={styles.fieldset}>
            <legend>Times</legend>
            <div className={styles.grid}>
              <label className={styles.field}>
                <span>Times written without a zone are</span>
                <select value={zoneless} onChange={(event) => setZoneless(event.target.value)}>
                  <option value="">Not stated: such times are refused</option>
                  {zone !== "UTC" && <option value={SITE_ZONE}>Clock time in {zone}, the site&apos;s zone</option>}
                  <optgroup label="At a fixed UTC offset">
                    {OFFSETS.map((offset) => (
                      <option key={offset} value={offset}>
                        {offset === "Z" ? "UTC (+00:00)" : offset}
                      </option>
                    ))}
                  </optgroup>
                </select>
              </label>
              <label className={styles.field}>
                <span>Dates like 03/04/2026 are</span>
                <select value={dayMonthOrder} onChange={(event) => setDayMonthOrder(event.target.value as "" | TDayMonthOrder)}>
                  <option value="">Not stated: such dates are refused</option>
                  <option value="day-first">Day first (31/12/2026)</option>
                  <option value="month-first">Month first (12/31/2026)</option>
                </select>
              </label>
            </div>
          </fieldset>

          <p className={styles.actions}>
            <button type="button" onClick={() => void run(true, "all-or-nothing")} disabled={busy}>
              Check the file
            </button>
            <button type="button" className={styles.primary} onClick={() => void run(false, "all-or-nothing")} disabled={busy}>
              Import
            </button>
          </p>
        </>
      )}

      {progress !== undefined && (
        <div className={styles.progress}>
          <label htmlFor="import-progress">{progress.text}</label>
          <progress id="import-progress" max={1} value={progress.fraction} />
        </div>
      )}
      <p className="visually-hidden" aria-live="polite" role="status">
        {announcement}
      </p>

      {failure !== undefined && (
        <section role="alert" className={styles.outcome} data-status="rejected">
          <h2>Import refused</h2>
          <p>{failure.message}</p>
          {failure.issues.length > 0 && (
            <ul>
              {failure.issues.map((issue, index) => (
                <li key={index}>{issue.path === "" ? issue.message : `${issue.path}: ${issue.message}`}</li>
              ))}
            </ul>
          )}
        </section>
      )}
      {result !== undefined && <ImportOutcome characteristicId={characteristic.id} result={result} busy={busy} onImportValidRows={() => void run(false, "valid-only")} />}
    </div>
  );
}
