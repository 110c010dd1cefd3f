/** The chart-data route, declared once for its handler and the OpenAPI document (src/api/routes.ts). */
import { ZIdParams } from "@/shared/api";
import { defineApiRoute } from "@/src/api/route-contract";
import { DEFAULT_MAX_POINTS, ZChartRangeQuery, ZChartView } from "./view";

export const chartDataRoute = defineApiRoute({
  method: "get",
  path: "/characteristics/{id}/chart-data",
  tag: "Characteristics",
  summary: "What the control chart draws for a range of subgroups",
  description:
    `Per plotted statistic, at most about maxPoints points (default ${DEFAULT_MAX_POINTS}) for the range: every ` +
    `signal point, both sides of every limit step and every corrected point are kept, the rest reduced to the ` +
    `lowest and highest point of each bucket. Each point names the limit version in force there; the limit ` +
    `segments state their limits once where those are the same at every point, and a point carries its own only ` +
    `where they vary (varying sample sizes, exact EWMA limits). Fields a point lacks are left out. Also the ` +
    `signals and the process events in the range.`,
  params: ZIdParams,
  query: ZChartRangeQuery,
  answer: { status: 200, description: "The chart view.", schema: ZChartView.meta({ id: "ChartView" }) },
  errors: [404, 422],
});
