// Provided at build time by modules/workerEntries.ts: the file:// URL of the bundled worker (valid once the server's entry has run).
declare module '#engine-worker' {
  export const engineWorkerUrl: () => string
}
