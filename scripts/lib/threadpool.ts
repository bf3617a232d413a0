/**
 * libuv's thread pool size for the server process. Node reads UV_THREADPOOL_SIZE once, at the first
 * file or crypto call, and under tsx that happens before any of our code runs, so it must be in the
 * environment the process starts with: `npm start` sets it in package.json, `npm run dev` when it
 * spawns the API. File reads (photos, packets), scrypt and zlib share these threads; with Node's
 * default of 4, a few slow jobs stall every photo. Password hashes are also queued
 * (server/auth/passwords.ts) so they can never take every thread.
 */
export const START_THREADPOOL_SIZE = 16;
