/**
 * Prisma's schema engine compiled to WebAssembly, driven through our SQLite driver adapter.
 *
 * The Prisma CLI normally runs a native schema-engine binary it downloads; this project cannot rely on that
 * download, so it loads the same engine (package @prisma/schema-engine-wasm, pinned to the build the
 * installed Prisma CLI uses) and hands it the better-sqlite3 adapter. The engine then reads and writes the
 * database through JavaScript, including the standard `_prisma_migrations` table.
 */
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import path from "node:path";
import { bindMigrationAwareSqlAdapterFactory, type SqlDriverAdapter } from "@prisma/driver-adapter-utils";
import * as engineBindings from "@prisma/schema-engine-wasm/schema_engine_bg";
import { createSqliteAdapterFactory } from "@/src/db/sqlite-adapter";

export type SchemaEngine = engineBindings.SchemaEngine;

/** A failure reported by the schema engine, with the driver's own error unwrapped when there is one. */
export class SchemaEngineError extends Error {
  override name = "SchemaEngineError";
}

let loading: Promise<void> | undefined;
/** The text of the last Rust panic inside the engine, if any (see loadEngineModule). */
let lastPanic: string | undefined;

/** Instantiates the WebAssembly module once per process. */
function loadEngineModule(): Promise<void> {
  loading ??= (async () => {
    // The engine reports a Rust panic through this global before aborting; keep the text for the error.
    const panicHolder = globalThis as { PRISMA_WASM_PANIC_REGISTRY?: { set_message(message: string): void } };
    panicHolder.PRISMA_WASM_PANIC_REGISTRY ??= { set_message: (message) => (lastPanic = message) };
    const require = createRequire(import.meta.url);
    const bindingsFile = require.resolve("@prisma/schema-engine-wasm/schema_engine_bg");
    const bytes = await readFile(path.join(path.dirname(bindingsFile), "schema_engine_bg.wasm"));
    // The module imports its JavaScript glue under this name (wasm-bindgen's bundler layout).
    const { instance } = await WebAssembly.instantiate(bytes, {
      "./schema_engine_bg.js": engineBindings as unknown as WebAssembly.ModuleImports,
    });
    engineBindings.__wbg_set_wasm(instance.exports);
    (instance.exports as { __wbindgen_start?: () => void }).__wbindgen_start?.();
  })();
  return loading;
}


/**
 * The engine sends whole migration scripts through `executeRaw`, which better-sqlite3 runs one statement at
 * a time; scripts without parameters go through `executeScript` instead. The engine does not use the
 * affected-row count of such scripts.
 */
function acceptScripts(adapter: SqlDriverAdapter): SqlDriverAdapter {
  const executeRaw = adapter.executeRaw.bind(adapter);
  adapter.executeRaw = async (query) => {
    if (query.args.length > 0) return executeRaw(query);
    await adapter.executeScript(query.sql);
    return 0;
  };
  return adapter;
}

export type TOpenedEngine = {
  engine: SchemaEngine;
  /** Runs an engine command, turning its errors into SchemaEngineError with the driver's message. */
  run<T>(command: (engine: SchemaEngine) => Promise<T>): Promise<T>;
  close(): Promise<void>;
};

/** Opens the engine on the SQLite file `databaseFile` (created if missing) with the schema at `schemaFile`. */
export async function openSchemaEngine(databaseFile: string, schemaFile: string): Promise<TOpenedEngine> {
  await loadEngineModule();
  const sqlite = createSqliteAdapterFactory(databaseFile);
  // Freeing the engine does not close the connections it opened: keep them to close them ourselves.
  const connections: SqlDriverAdapter[] = [];
  const track = (adapter: SqlDriverAdapter): SqlDriverAdapter => {
    connections.push(adapter);
    return acceptScripts(adapter);
  };
  const factory = bindMigrationAwareSqlAdapterFactory({
    provider: sqlite.provider,
    adapterName: sqlite.adapterName,
    connect: async () => track(await sqlite.connect()),
    connectToShadowDb: async () => track(await sqlite.connectToShadowDb()),
  });
  const translate = (error: unknown): SchemaEngineError => {
    const text = error instanceof Error ? error.message : String(error);
    // Adapter errors reach the engine as "External error id#N"; the original is kept in the registry.
    const id = /External error id#(\d+)/.exec(text)?.[1];
    const original = id === undefined ? undefined : factory.errorRegistry.consumeError(Number(id))?.error;
    const detail = original instanceof Error ? original.message : (lastPanic ?? text.split("\n")[0] ?? text);
    return new SchemaEngineError(detail, { cause: error });
  };
  const schemaText = await readFile(schemaFile, "utf8");
  const engine = await engineBindings.SchemaEngine.new({ datamodels: [[schemaFile, schemaText]] }, () => {}, factory).catch(
    async (error: unknown) => {
      await Promise.all(connections.map((connection) => connection.dispose()));
      throw translate(error);
    },
  );
  return {
    engine,
    run: (command) =>
      command(engine).catch((error: unknown) => {
        throw translate(error);
      }),
    close: async () => {
      engine.free();
      await Promise.all(connections.map((connection) => connection.dispose()));
    },
  };
}
