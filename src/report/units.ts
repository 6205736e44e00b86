/**
 * The report's display units: the shared presentation layer's table
 * (src/present/units.ts, NIST SP 811 factors).
 */
export { NIST, UNIT_SYSTEMS, unitOf, units, type DisplayUnit, type ReportQuantity, type Quantity, type UnitSystem, type Units } from '../present/units.js';
export { fixed } from '../present/number.js';
