// The analysis library: pure functions over typed arrays (see DEVELOPERS.md).
export * from "./types";
export * from "./thresholds";
export * from "./series-collector";
// Geodesy and track
export * from "./geodesy";
export * from "./gps-fix";
export * from "./position-jumps";
export * from "./track";
// Route
export * from "./waypoint-progress";
export * from "./rth-deviation";
export * from "./route";
// Link, failsafe, power
export * from "./spans";
export * from "./span-event";
export * from "./link";
export * from "./failsafe-modes";
export * from "./failsafe-behaviour";
export * from "./failsafe";
export * from "./power";
// Range and verdict
export * from "./linear-fit";
export * from "./free-space-loss";
export * from "./range";
export * from "./verdict";
export * from "./analyse-run";
