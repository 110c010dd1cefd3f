// CSV import: the raw file as the body, options in the query; answers NDJSON progress then the result.
import { handleImportUpload } from "@/src/imports/upload";

export const POST = handleImportUpload;
