/** The athlete's own pages. The home stays at /athlete. */
export const ATHLETE_HOME = '/athlete';
export const ATHLETE_REPORT = '/athlete/report';
export const ATHLETE_CHECK_IN = '/athlete/check-in';
export const ATHLETE_LOG = '/athlete/log';
export const ATHLETE_WEEK = '/athlete/week';
