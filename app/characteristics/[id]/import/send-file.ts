/**
 * Sends the file to the import route with XMLHttpRequest, whose `upload.onprogress` reports real upload
 * progress, then reads the NDJSON answer line by line as it arrives (the server's reading progress, then
 * the result). Fetch cannot report upload progress, hence XHR.
 */
import type { TImportResult } from "@/src/imports/import-csv";
import type { TImportOptionsInput } from "@/src/imports/options";
import type { TImportMessage } from "@/src/imports/upload";

export type TSendProgress =
  | { readonly phase: "uploading"; readonly loaded: number; readonly total: number }
  | { readonly phase: "reading"; readonly bytesRead: number; readonly totalBytes: number; readonly rowsRead: number };

export type TSendOutcome =
  | { readonly ok: true; readonly result: TImportResult }
  | { readonly ok: false; readonly message: string; readonly issues: readonly { path: string; message: string }[] };

export function sendFile(characteristicId: number, file: File, options: TImportOptionsInput, onProgress: (progress: TSendProgress) => void): Promise<TSendOutcome> {
  return new Promise((resolve) => {
    const request = new XMLHttpRequest();
    const url = `/api/v1/characteristics/${characteristicId}/imports?options=${encodeURIComponent(JSON.stringify(options))}`;
    request.open("POST", url);
    request.setRequestHeader("content-type", "text/csv");
    request.upload.onprogress = (event) => onProgress({ phase: "uploading", loaded: event.loaded, total: event.lengthComputable ? event.total : file.size });
    let consumed = 0;
    let outcome: TSendOutcome | undefined;
    const readLines = () => {
      const text = request.responseText;
      let end = text.indexOf("\n", consumed);
      while (end !== -1) {
        const message = JSON.parse(text.slice(consumed, end)) as TImportMessage;
        consumed = end + 1;
        if (message.type === "progress") onProgress({ phase: "reading", ...message });
        else if (message.type === "result") outcome = { ok: true, result: message.result };
        else outcome = { ok: false, message: message.error.message, issues: message.error.issues };
        end = text.indexOf("\n", consumed);
      }
    };
    request.onprogress = () => {
      if (request.status === 200) readLines();
    };
    request.onload = () => {
      if (request.status !== 200) {
        try {
          const body = JSON.parse(request.responseText) as { error: { message: string; issues: { path: string; message: string }[] } };
          resolve({ ok: false, message: body.error.message, issues: body.error.issues });
        } catch {
          resolve({ ok: false, message: `The server answered ${request.status} ${request.statusText}.`, issues: [] });
        }
        return;
      }
      readLines();
      resolve(outcome ?? { ok: false, message: "The server's answer ended before the import finished.", issues: [] });
    };
    request.onerror = () => resolve({ ok: false, message: "The file could not be sent: the connection to the server failed.", issues: [] });
    request.send(file);
  });
}
