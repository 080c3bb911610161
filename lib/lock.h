/*
 * lock.h: one run at a time on a state file (cw-wear and cw-dcir
 * --state), and the leftovers of runs that were killed.
 *
 * The state itself cannot be locked: outf replaces it by rename(2), so a
 * lock on it would stay on the old file while the next run reads the new
 * one.  The lock is an fcntl(2) write lock on a lock file beside the
 * state, named FILE.lock (FILE after its symbolic links are resolved,
 * when it exists, so that two names of one state share one lock).  The
 * lock file is made once and left in place, empty: removing it would let
 * a run that waits on the old one and a run that makes a new one both go
 * on.  The kernel drops the lock when the run ends, however it ends
 * (SIGKILL included), so a lock is never left stale.
 *
 * fcntl locks, not flock(2): they are POSIX, and Linux's NFS client
 * carries them to the server, where flock(2) locks were local to one
 * machine before Linux 2.6.12.  A state is meant for a local disk all
 * the same (see CAVEATS in cw-wear(1)).
 *
 * Once it holds the lock, a run removes the temporaries that a killed run
 * on the same state left beside it (".FILE.tmpXXXXXX", as outf names
 * them): no live run can be writing them, as it would hold the lock.
 */
#ifndef LOCK_H
#define LOCK_H

#include "cw.h"

/* The default of --lock-wait: an hour, in microseconds. */
#define LOCK_WAIT_DEFAULT	(3600 * CW_US_PER_S)

/*
 * Take the lock of the state at PATH, waiting up to WAIT microseconds (0:
 * not at all) while another run holds it.  Exits 1 with a message when
 * the wait runs out or the lock file cannot be made; returns once the
 * lock is held, which it is until the process ends.  Then removes the
 * temporaries of killed runs (how many, with -v).
 */
void	lock_state(const char *path, cw_time wait);

#endif
