import { apiHandler } from "@/src/api/handler";
import { postSubgroupsRoute } from "@/src/api/routes";
import { signalAnswer, signalChange } from "@/src/api/signal-answer";
import { appendSubgroups } from "@/src/subgroups";

export const dynamic = "force-dynamic";

export const POST = apiHandler(postSubgroupsRoute, async ({ database, params, body, now }) => {
  const result = await appendSubgroups(database, params.id, body.subgroups, { source: "api", now });
  return {
    stored: result.stored,
    signals: result.signals.map((signal) => ({ ...signalAnswer(signal), change: signalChange(signal, now) })),
    limits: result.limits === null ? null : { version: result.limits.version },
    notes: result.notes,
  };
});
