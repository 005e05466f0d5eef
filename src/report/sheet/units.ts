/** Kept for imports written before the formatting moved: every number for people is formatted in src/report/format-number.ts. */
export * from '../format-number.js';
