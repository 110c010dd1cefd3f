import { apiHandler } from "@/src/api/handler";
import { listLimitSetsRoute, reviseLimitsRoute } from "@/src/api/routes";
import { getCharacteristic } from "@/src/characteristics/setup";
import { limitSetsFor, reviseLimits } from "@/src/limits";

export const dynamic = "force-dynamic";

export const GET = apiHandler(listLimitSetsRoute, async ({ database, params }) => {
  // An unknown characteristic answers 404 rather than an empty list.
  await getCharacteristic(database, params.id);
  return { limitSets: await limitSetsFor(database, params.id) };
});

export const POST = apiHandler(reviseLimitsRoute, async ({ database, params, body, now }) => {
  const limitSet = await reviseLimits(database, params.id, body, now);
  // reviseLimits records its re-evaluation in the same transaction; this request's is the one it stamped with `now`.
  const reevaluation = await database.signalEvaluation.findFirstOrThrow({
    where: { characteristicId: params.id, trigger: "limit-revision", at: now, requestedBy: body.approvedBy },
    orderBy: { id: "desc" },
    select: { id: true, at: true, signalsBefore: true, signalsAfter: true },
  });
  return { limitSet, reevaluation };
});
