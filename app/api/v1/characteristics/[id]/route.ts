import { apiHandler } from "@/src/api/handler";
import { getCharacteristicRoute } from "@/src/api/routes";
import { getCharacteristic } from "@/src/characteristics/setup";

export const dynamic = "force-dynamic";

export const GET = apiHandler(getCharacteristicRoute, ({ database, params }) => getCharacteristic(database, params.id));
