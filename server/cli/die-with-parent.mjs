// Preloaded (`node --import`) into every process `npm start` starts: when the process that
// started it goes away without stopping it (killed outright, or npm ended without passing the
// signal on), it stops itself the usual way (SIGTERM, so its own clean shutdown runs).
const parent = process.ppid;
const timer = setInterval(() => {
  let gone = process.ppid !== parent;
  if (!gone) {
    try {
      process.kill(parent, 0);
    } catch {
      gone = true;
    }
  }
  if (!gone) return;
  clearInterval(timer);
  process.kill(process.pid, 'SIGTERM');
  // Whatever its handler does, it is gone a few seconds later.
  setTimeout(() => process.exit(0), 5_000).unref();
}, 500);
timer.unref();
