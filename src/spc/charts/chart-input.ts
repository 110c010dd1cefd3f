/** Options shared by every chart family's Phase I estimate, and the data-kind checks they share. */
import { SpcInputError, type AttributesData, type BaselineSpec, type ChartData, type ChartType, type CusumDesign, type EwmaDesign, type VariablesData } from "../types";

export interface EstimateOptions {
  readonly baseline?: BaselineSpec;
  /** Expected subgroup size (variables charts); every subgroup must have it. */
  readonly subgroupSize?: number;
  readonly ewma?: EwmaDesign;
  readonly cusum?: CusumDesign;
  /** Known or desired process centre for variables charts, used instead of the baseline mean. */
  readonly target?: number;
}

export function requireVariables(data: ChartData, chart: ChartType): VariablesData {
  if (data.kind !== "variables") throw new SpcInputError(`the ${chart} chart needs measured values, not counts`);
  return data;
}

export function requireAttributes(data: ChartData, chart: ChartType): AttributesData {
  if (data.kind !== "attributes") throw new SpcInputError(`the ${chart} chart needs counts, not measured values`);
  return data;
}
