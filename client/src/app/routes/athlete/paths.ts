/** The athlete's own pages. The home stays at /athlete. */
export const ATHLETE_HOME = '/athlete';
export const ATHLETE_REPORT = '/athlete/report';
export const ATHLETE_CHECK_IN = '/athlete/check-in';
export const ATHLETE_LOG = '/athlete/log';
/** "Log this session": the log form starting from a planned session of that day. */
export const athleteLogSessionHref = (sessionId: string, date: string) =>
  `${ATHLETE_LOG}?session=${encodeURIComponent(sessionId)}&date=${encodeURIComponent(date)}`;
export const ATHLETE_WEEK = '/athlete/week';
export const ATHLETE_CLIPS = '/athlete/clips';
export const ATHLETE_NEW_CLIP = '/athlete/clips/new';
export const athleteNewClipHref = (logId: string) => `${ATHLETE_NEW_CLIP}?log=${encodeURIComponent(logId)}`;
export const ATHLETE_DOCUMENTS = '/athlete/documents';
