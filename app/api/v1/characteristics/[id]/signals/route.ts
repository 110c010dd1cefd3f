import { apiHandler } from "@/src/api/handler";
import { listSignalsRoute } from "@/src/api/routes";
import { signalAnswer } from "@/src/api/signal-answer";
import { signalsFor } from "@/src/signals";

export const dynamic = "force-dynamic";

export const GET = apiHandler(listSignalsRoute, async ({ database, params, query }) => ({
  signals: (await signalsFor(database, params.id, query)).map(signalAnswer),
}));
