export { parseQuantity, toQuantityValue, QuantityParseError } from './parse';
export type { Quantity } from './parse';
export { formatQuantity, formatNumber } from './format';
export { UNITS, isUnit } from './units';
export type { Unit } from './units';
