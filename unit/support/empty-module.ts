// Stands in for the `server-only` marker package under jest.
export {};
