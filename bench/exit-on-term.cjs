// Preloaded into the service when BENCH_PROFILE is set: a stop signal ends the process normally, so
// node's --cpu-prof writes its profile (it does not when the process is killed).
process.on('SIGTERM', () => process.exit(0));
