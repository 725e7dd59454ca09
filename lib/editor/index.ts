export * from "./types";
export * from "./ids";
export * from "./grid";
export * from "./operations";
export * from "./history";
export * from "./selection";
