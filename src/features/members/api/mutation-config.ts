/** What a route may add to a member mutation: e.g. refresh the project, whose `myRole` may have changed. */
export type MemberMutationConfig = { onChanged?: () => unknown };
