export * from "./auth";
export * from "./venues";
export * from "./submissions";
export * from "./mail";
export * from "./files";
