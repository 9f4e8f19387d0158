/** What validateDocument refuses before reading a document at all (hostile or runaway input). */
export const validationLimits = {
  maxDepth: 24,
  maxValues: 3_000_000,
  maxStringLength: 100_000,
  maxProblems: 1000,
};
