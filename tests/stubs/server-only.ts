// vitest runs outside the react-server condition; the real package would throw.
export {};
