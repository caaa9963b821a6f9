/** Pages shared by coaches and clinicians. */
export const staffWorkloadHref = (athleteId: string) => `/staff/athletes/${athleteId}/workload`;
export const STAFF_FLAGS = '/staff/flags';
