import { apiHandler } from "@/src/api/handler";
import { listEventsRoute, postEventRoute } from "@/src/api/routes";
import { eventsFor, recordEvent } from "@/src/events";

export const dynamic = "force-dynamic";

export const POST = apiHandler(postEventRoute, ({ database, params, body, now }) => recordEvent(database, params.id, body, now));

export const GET = apiHandler(listEventsRoute, async ({ database, params, query }) => ({
  events: await eventsFor(database, params.id, {
    ...(query.from === undefined ? {} : { from: new Date(query.from) }),
    ...(query.to === undefined ? {} : { to: new Date(query.to) }),
  }),
}));
