// Lets modules marked server-only load under vitest (which is a server context).
export {};
