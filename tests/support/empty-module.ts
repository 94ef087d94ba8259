// Stands in for the "server-only" marker package when server modules are imported by tests.
export {};
