/** The wire catalogue: everything other folders use, in one place. */
export * from "./types.js";
export * from "./copper.js";
export { awgDiameter, awgName, awgNumber, awgNumbers, awgOverall, nemaRows, FILM_BUILDS, AWG_MIN_N, AWG_MAX_N } from "./awg.js";
export { swgDiameter, swgName, swgNames, swgOverall } from "./swg.js";
export { metricNominals, metricName, metricOverall, nearestNominals } from "./metric.js";
export { GRADES, type Grade } from "./overall.js";
export { REFERENCE_ROWS, type ReferenceRow } from "./data/overall-reference.js";
export { resolveWire, catalogue, defaultStock, findNominalMetric, formatMm, type CatalogueFilter } from "./catalogue.js";
export { parseWireSpec, type WireRole, type ParseWireResult } from "./parse.js";
