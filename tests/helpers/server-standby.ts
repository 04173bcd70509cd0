/**
 * The real server's entry point, started late: this process loads the server's modules at once (most of a
 * start-up's time), then waits for a line on stdin and only then imports server/index.ts, which opens the
 * database and listens exactly as `npm start` does. Tests that restart the server many times start the next
 * process while the current one still runs, and send the line once the current one is dead.
 */
await import('../../server/bootstrap');
console.log('standby: modules loaded');
await new Promise((resolve) => process.stdin.once('data', resolve));
await import('../../server/index');
