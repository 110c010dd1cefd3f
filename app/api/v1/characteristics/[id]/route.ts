import { apiHandler } from "@/src/api/handler";
import { getCharacteristicRoute, updateCharacteristicRoute } from "@/src/api/routes";
import { changeCharacteristic, getCharacteristic } from "@/src/characteristics/setup";

export const dynamic = "force-dynamic";

export const GET = apiHandler(getCharacteristicRoute, ({ database, params }) => getCharacteristic(database, params.id));

/** Fields left out keep their stored values and null clears one (changeCharacteristic). */
export const POST = apiHandler(updateCharacteristicRoute, async ({ database, params, body, now }) => {
  const { changedBy, ...changes } = body;
  return changeCharacteristic(database, params.id, changes, { now, changedBy });
});
