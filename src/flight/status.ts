/** How a flight ended. Anything but LANDED is a failed sample and is never written as a landing. */
export const FlightStatus = {
  LANDED: 0,
  NON_FINITE: 1,
  MAX_TIME: 2,
  MAX_STEPS: 3,
  NO_LIFTOFF: 4,
  STEP_UNDERFLOW: 5,
} as const;

export type FlightStatusCode = (typeof FlightStatus)[keyof typeof FlightStatus];

/** Human-readable reasons, indexed by status code. */
export const FAILURE_REASONS: readonly string[] = [
  'landed',
  'state became non-finite',
  'maximum flight time exceeded',
  'maximum step count exceeded',
  'did not leave the pad',
  'step size fell below the smallest allowed',
];
