// Vitest runs outside React's server environment; the marker package would throw there.
export {};
