export * from './schema';
export { validateDocument, semanticProblems, formatPath, validationLimits } from './validate';
export type { Problem, ValidationResult } from './validate';
