/**
 * The demo facility trains on the US West Coast: its days start eight hours after UTC's (seven in
 * summer). Kept free of imports so the browser tests can read it without loading the ORM.
 */
export const DEMO_TIME_ZONE = 'America/Los_Angeles';
