// The rejected rows of a "valid rows only" import, as CSV with a line and a reason column.
import { handleRejectedRowsDownload } from "@/src/imports/upload";

export const GET = handleRejectedRowsDownload;
