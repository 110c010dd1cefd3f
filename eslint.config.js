import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";

const config = [
  { ignores: [".next/**", "node_modules/**", "src/db/generated/**", "next-env.d.ts", "data/**", ".tmp/**"] },
  ...nextCoreWebVitals,
  ...nextTypescript,
];

export default config;
