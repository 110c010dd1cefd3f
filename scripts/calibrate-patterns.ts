/**
 * Calibrate the pattern reader by seeded simulation and publish its confusion matrix:
 *   npx tsx scripts/calibrate-patterns.ts [replicates]
 * Prints the matrix (rows: planted kind incl. "none"; columns: reported kind) and writes it into
 * docs/patterns-and-verification.md between the calibration markers.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { calibratePatterns, confusionTable, DEFAULT_CALIBRATION_DESIGN } from "../src/spc/patterns/calibration";

const DOCS = new URL("../docs/patterns-and-verification.md", import.meta.url);
const BEGIN = "<!-- calibration:begin -->";
const END = "<!-- calibration:end -->";

const replicates = Number(process.argv[2] ?? DEFAULT_CALIBRATION_DESIGN.replicates);
const design = { ...DEFAULT_CALIBRATION_DESIGN, replicates };
const result = calibratePatterns(design);
const table = confusionTable(result);
const summary =
  `Seed ${design.seed}; ${design.replicates} series per cell; subgroup sizes ${design.subgroupSizes.join(" and ")}; ` +
  `${design.baseline} baseline subgroups, then ${design.monitoringLengths.join(" or ")} monitored, onset 5 subgroups in; ` +
  `rules: ${design.rules}.`;
console.log(`${summary}\n\n${table}`);

const page = readFileSync(DOCS, "utf8");
const start = page.indexOf(BEGIN);
const end = page.indexOf(END);
if (start < 0 || end < start) throw new Error(`markers ${BEGIN} … ${END} not found in ${DOCS.pathname}`);
writeFileSync(DOCS, `${page.slice(0, start + BEGIN.length)}\n${summary}\n\n${table}\n${page.slice(end)}`);
