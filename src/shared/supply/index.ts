/** The insect supply module: substrates and their defaults, the weekly plan, rules and the land-use comparison. */
export * from './substrates';
export * from './plan';
export * from './rules';
export * from './land-use';
