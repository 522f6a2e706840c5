/** The motor model: constants, brush drop, calibration (the `fit…` functions), steady state, density, duty. */
export * from "./emf.js";
export * from "./brush.js";
export * from "./model.js";
export * from "./calibrate.js";
export * from "./density.js";
export * from "./duty.js";
