/** The tool's version, printed by --version and on every card's footer. Kept in step with package.json by a test. */
export const VERSION = "0.1.0";
