// The Drizzle schema, one file per area under schema/; later issues add designs, revisions, reports,
// reviews, releases and audit events as new files re-exported here (drizzle.config.ts reads this file).
export * from "./schema/users";
export * from "./schema/projects";
export * from "./schema/designs";
export * from "./schema/analyses";
export * from "./schema/audit";
export * from "./schema/mail";
export * from "./schema/templates";
export * from "./schema/reviews";
export * from "./schema/tokens";
export * from "./schema/verifications";
