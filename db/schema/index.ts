export * from "./enums";
export * from "./sites";
export * from "./people";
export * from "./instruments";
export * from "./weights";
export * from "./checks";
export * from "./history";
export * from "./programme";
