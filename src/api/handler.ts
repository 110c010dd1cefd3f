/**
 * The one wrapper around every API route handler. In order, it
 * 1. refuses callers that are not on this machine (403; see loopback.ts: API tokens come later),
 * 2. validates the path parameters and the query with the route's zod schemas (422),
 * 3. reads the JSON body safely and validates it (415, 413, 400, 422; see body.ts),
 * 4. calls the domain with the application's Prisma client and the current time,
 * 5. shapes the answer through the route's answer schema (unknown fields dropped; a mismatch is a bug),
 * and turns every failure into the one error shape (problem.ts). Handlers stay a few lines long.
 */
import { z } from "zod";
import { AppError, parseInput } from "@/src/errors";
import type { PrismaClient } from "@/src/db/connect";
import { readJsonBody } from "./body";
import { apiDatabase } from "./database";
import { loopbackRefusal } from "./loopback";
import { problemAnswer } from "./problem";
import type { TApiRoute } from "./route-contract";

type Parsed<TSchema> = TSchema extends z.ZodType ? z.output<TSchema> : undefined;

export interface TApiCall<TRoute extends TApiRoute> {
  readonly database: PrismaClient;
  readonly params: Parsed<TRoute["params"]>;
  readonly query: Parsed<TRoute["query"]>;
  readonly body: Parsed<TRoute["body"]>;
  readonly now: Date;
}

/** Next.js passes dynamic segments as a promise (Next 15+). */
export interface TRouteContext {
  readonly params: Promise<Record<string, string | string[] | undefined>>;
}

export type TRouteHandler = (request: Request, context: TRouteContext) => Promise<Response>;

/** The query string as an object; a parameter given twice is refused rather than guessed at. */
function queryObject(url: URL): Record<string, string> {
  const query: Record<string, string> = {};
  for (const [key, value] of url.searchParams) {
    if (key in query) {
      throw new AppError("invalid-input", `The query parameter "${key}" is given more than once.`, [
        { path: key, message: "is given more than once" },
      ]);
    }
    query[key] = value;
  }
  return query;
}

/**
 * An answer before serialisation, as the domain returns it: wherever text is expected a Date may stand
 * (it becomes ISO 8601), and vocabulary fields may be plain strings (database columns are text); the
 * answer schema checks both at run time.
 */
export type TAnswerWithDates<T> = T extends string
  ? string | Date
  : T extends readonly (infer Item)[]
    ? readonly TAnswerWithDates<Item>[]
    : T extends object
      ? { readonly [Key in keyof T]: TAnswerWithDates<T[Key]> }
      : T;

/** An answer with the route's alternative success status (`answer.alternative` in its declaration). */
export class StatusAnswer<T> {
  constructor(
    readonly status: 200 | 201,
    readonly answer: T,
  ) {}
}

/** A Next.js route handler for `route`, running `handle` with validated input. */
export function apiHandler<TRoute extends TApiRoute>(
  route: TRoute,
  handle: (
    call: TApiCall<TRoute>,
  ) => Promise<TAnswerWithDates<z.input<TRoute["answer"]["schema"]>> | StatusAnswer<TAnswerWithDates<z.input<TRoute["answer"]["schema"]>>>>,
): TRouteHandler {
  return async (request, context) => {
    try {
      const refusal = loopbackRefusal(request.headers);
      if (refusal !== undefined) {
        throw new AppError(
          "forbidden",
          `The API answers only callers on this machine until API tokens exist: ${refusal}.`,
        );
      }
      const params = route.params ? parseInput(route.params, await context.params, "path") : undefined;
      const query = route.query ? parseInput(route.query, queryObject(new URL(request.url)), "query") : undefined;
      const body = route.body ? parseInput(route.body, await readJsonBody(request), "request body") : undefined;
      const result = await handle({
        database: await apiDatabase(),
        params,
        query,
        body,
        now: new Date(),
      } as TApiCall<TRoute>);
      const { status, answer: unchecked } = result instanceof StatusAnswer ? result : { status: route.answer.status, answer: result };
      if (status !== route.answer.status && status !== route.answer.alternative?.status) {
        throw new Error(`The handler of ${route.method.toUpperCase()} ${route.path} answered ${status}, a status its declaration does not name`);
      }
      // The JSON round trip turns Dates into ISO strings before the answer schema checks and trims.
      const answer = route.answer.schema.parse(JSON.parse(JSON.stringify(unchecked)));
      return Response.json(answer, { status });
    } catch (error) {
      return problemAnswer(error);
    }
  };
}
