import { apiHandler, StatusAnswer } from "@/src/api/handler";
import { postSubgroupsRoute } from "@/src/api/routes";
import { signalAnswer, signalChange } from "@/src/api/signal-answer";
import { appendPostedSubgroups } from "@/src/subgroups/append";

export const dynamic = "force-dynamic";

export const POST = apiHandler(postSubgroupsRoute, async ({ database, params, body, now }) => {
  const result = await appendPostedSubgroups(database, params.id, body.subgroups, now);
  // 201 when this request created anything; 200 when it was wholly a replay (docs/api.md says why).
  return new StatusAnswer(result.stored.length > 0 ? 201 : 200, {
    outcomes: result.outcomes,
    stored: result.stored,
    signals: result.signals.map((signal) => ({ ...signalAnswer(signal), change: signalChange(signal, now) })),
    limits: result.limits === null ? null : { version: result.limits.version },
    notes: result.notes,
  });
});
