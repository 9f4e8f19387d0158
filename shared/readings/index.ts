export * from './expected';
export * from './mark';
