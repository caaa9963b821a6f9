/**
 * The one page of a pain report, for everyone who may read it (the server decides who, and which
 * fields). Here, not under app/, because the caseload, flags and notices features link to it.
 */
export const painReportHref = (reportId: string) => `/pain-reports/${reportId}`;
