import { apiHandler } from "@/src/api/handler";
import { openApiDocument } from "@/src/api/openapi";
import { openApiRoute } from "@/src/api/routes";

export const dynamic = "force-dynamic";

export const GET = apiHandler(openApiRoute, async () => ({ ...openApiDocument() }));
