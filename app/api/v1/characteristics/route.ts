import { apiHandler } from "@/src/api/handler";
import { createCharacteristicRoute, listCharacteristicsRoute } from "@/src/api/routes";
import { createCharacteristic, getCharacteristic } from "@/src/characteristics/setup";

export const dynamic = "force-dynamic";

export const GET = apiHandler(listCharacteristicsRoute, async ({ database }) => {
  const rows = await database.characteristic.findMany({ select: { id: true }, orderBy: [{ processId: "asc" }, { name: "asc" }] });
  const characteristics = [];
  // One at a time: SQLite serves one reader per connection anyway, and the list is short.
  for (const { id } of rows) characteristics.push(await getCharacteristic(database, id));
  return { characteristics };
});

export const POST = apiHandler(createCharacteristicRoute, ({ database, body }) => createCharacteristic(database, body));
