/** Query keys of my API tokens. */
export const tokenKeys = {
  all: ["tokens"] as const,
  mine: () => [...tokenKeys.all, "mine"] as const,
};
