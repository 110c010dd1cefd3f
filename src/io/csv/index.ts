export { CsvInputError, formatProblem, MAX_PROBLEMS_SHOWN, type CsvProblem } from "./errors";
export { parseChartCsv, SUBGROUP_SIZE_RANGE, type ChartCsvOptions, type ChartInput } from "./chart-csv";
export { InputFileError, readChartCsvFile } from "./read-file";
export { CHART_INPUT_LAYOUT, DECIMAL_NUMBER, LAYOUT_COLUMNS } from "./row-schemas";
