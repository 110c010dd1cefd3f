import { apiHandler } from "@/src/api/handler";
import { getCharacteristicRoute, updateCharacteristicRoute } from "@/src/api/routes";
import { getCharacteristic, updateCharacteristic } from "@/src/characteristics/setup";

export const dynamic = "force-dynamic";

export const GET = apiHandler(getCharacteristicRoute, ({ database, params }) => getCharacteristic(database, params.id));

/** Fields left out keep their stored values and null clears one; the domain validates the result whole. */
export const POST = apiHandler(updateCharacteristicRoute, async ({ database, params, body, now }) => {
  const { changedBy, ...changes } = body;
  const current = { ...(await getCharacteristic(database, params.id)), ...changes };
  return updateCharacteristic(
    database,
    params.id,
    {
      processId: current.processId,
      name: current.name,
      unit: current.unit,
      chartType: current.chartType,
      subgroupSize: current.subgroupSize,
      target: current.target ?? undefined,
      lowerSpecLimit: current.lowerSpecLimit ?? undefined,
      upperSpecLimit: current.upperSpecLimit ?? undefined,
      ruleSet: current.ruleSet,
      safetyRelated: current.safetyRelated,
      description: current.description ?? undefined,
    },
    { now, changedBy },
  );
});
