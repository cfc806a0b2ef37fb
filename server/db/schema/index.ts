export * from "./change-log";
export * from "./networks";
export * from "./role-grants";
export * from "./sessions";
export * from "./sites";
export * from "./system";
export * from "./users";
