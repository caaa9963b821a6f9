export const clinicianAthleteHref = (athleteId: string) => `/clinician/athletes/${athleteId}`;
export const clinicianCaseHref = (caseId: string) => `/clinician/cases/${caseId}`;
