// Names of the demo data (db/seed.ts) that tests look up.
export const DEMO_LAB_NAME = "Wrenfield Imaging Lab";
