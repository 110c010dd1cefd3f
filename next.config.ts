import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Native and WebAssembly modules load from node_modules at run time instead of being bundled.
  serverExternalPackages: ["better-sqlite3", "@prisma/adapter-better-sqlite3", "@prisma/schema-engine-wasm"],
  typedRoutes: false,
};

export default nextConfig;
