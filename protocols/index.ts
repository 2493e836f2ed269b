// The step language: schemas and types, reference resolution, display helpers and the built-in
// procedure templates. Pure: no database, no React, no clock.
export * from './acceptance-criterion';
export * from './assert-never';
export * from './cell-specification';
export * from './charge-retention';
export * from './compare-procedures';
export * from './compare-references';
export * from './decision-rule';
export * from './describe-caution-code';
export * from './describe-criterion';
export * from './describe-step';
export * from './designation';
export * from './format-number';
export * from './format-quantity';
export * from './identifier';
export * from './measurement-tolerances';
export * from './procedure';
export * from './quantity';
export * from './repeat-rule';
export * from './resolve-procedure';
export * from './resolve-quantity';
export * from './resolved-procedure';
export * from './specification-fields';
export * from './step';
export * from './units';
export * from './validate-input';
export * from './templates';
