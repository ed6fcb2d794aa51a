// Provided at build time by modules/workerEntries.ts: the file:// URL of the bundled fit worker (valid once the server's entry has run).
declare module '#fit-worker' {
  export const fitWorkerUrl: () => string
}
