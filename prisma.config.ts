// Prisma 7 configuration, read by the Prisma CLI (`prisma generate`, and `prisma migrate deploy` on machines
// that can fetch the native engine). The project's own migration scripts read the same paths from
// src/db/migrations/paths.ts and the URL from src/config/env.ts.
import { defineConfig } from "prisma/config";
import { environment } from "./src/config/env";

export default defineConfig({
  schema: "prisma/schema.prisma",
  migrations: { path: "prisma/migrations" },
  datasource: { url: environment().databaseUrl },
});
