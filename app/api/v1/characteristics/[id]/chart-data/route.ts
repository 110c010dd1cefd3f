import { apiHandler } from "@/src/api/handler";
import { chartDataRoute } from "@/src/chart-data/api-route";
import { chartDatabase } from "@/src/chart-data/database";
import { loadChartView } from "@/src/chart-data/load";

export const dynamic = "force-dynamic";

// The chart reads through its own read-only connection (src/chart-data/load.ts says why), not the Prisma client.
export const GET = apiHandler(chartDataRoute, async ({ params, query }) =>
  loadChartView(chartDatabase(), params.id, { fromSequence: query.from, toSequence: query.to, maxPoints: query.maxPoints }),
);
