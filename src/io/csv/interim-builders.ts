// Interim stand-ins for the builders of src/spc/data.ts (same signatures), until that file lands.
import type { AttributesData, VariablesData } from "../../spc/types";

export function variablesData(subgroups: number[][]): VariablesData {
  const offsets = new Uint32Array(subgroups.length + 1);
  subgroups.forEach((subgroup, index) => (offsets[index + 1] = (offsets[index] ?? 0) + subgroup.length));
  return { kind: "variables", values: Float64Array.from(subgroups.flat()), offsets };
}
export function individualsData(values: number[]): VariablesData {
  return variablesData(values.map((value) => [value]));
}
export function attributesData(counts: number[], sizes: number[]): AttributesData {
  return { kind: "attributes", counts: Float64Array.from(counts), sizes: Float64Array.from(sizes) };
}
