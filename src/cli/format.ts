/** The terminal's number formatting is the shared one (src/format): re-exported for the CLI's commands. */
export * from "../format/number.js";
export * from "../format/units.js";
export * from "../format/goal.js";
