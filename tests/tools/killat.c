/*
 * killat: run a command and SIGKILL it at a chosen point of its write of
 * a file, for the kill tests of the state files (tests/cli/cw-wear,
 * tests/cli/cw-dcir: state-kill.sh).
 *
 *	killat DIR PREFIX DELAY_US command [arg ...]
 *
 * Runs the command (standard output and error to /dev/null), watches DIR
 * for a file whose name starts with PREFIX (the temporary that outf makes
 * beside the state), and DELAY_US microseconds after it first shows,
 * kills the command with SIGKILL (a negative DELAY_US: never).  Prints one line: "killed", or "exited
 * N" when the command ended first (the write was done by then, or never
 * began); with "seen" or "unseen" after it, whether the temporary showed,
 * and for "exited N seen" the microseconds from then to the end.
 * Exits 0, or 2 on a usage or system error.
 */
#include <dirent.h>
#include <errno.h>
#include <fcntl.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>
#include <unistd.h>
#include <sys/wait.h>

static int
present(const char *dir, const char *prefix)
{
	struct dirent *e;
	size_t n = strlen(prefix);
	DIR *dp = opendir(dir);
	int found = 0;

	if (dp == NULL)
		return 0;
	while (!found && (e = readdir(dp)) != NULL)
		found = strncmp(e->d_name, prefix, n) == 0;
	closedir(dp);
	return found;
}

static void
pause_us(long us)
{
	struct timespec ts;

	ts.tv_sec = us / 1000000;
	ts.tv_nsec = (us % 1000000) * 1000;
	while (nanosleep(&ts, &ts) != 0 && errno == EINTR)
		;
}

int
main(int argc, char *argv[])
{
	struct timespec t0, t1;
	pid_t pid, w;
	long delay;
	int st, fd, seen = 0;

	if (argc < 5) {
		fprintf(stderr, "usage: killat DIR PREFIX DELAY_US command "
		    "[arg ...]\n");
		return 2;
	}
	delay = strtol(argv[3], NULL, 10);
	if ((pid = fork()) < 0) {
		perror("killat: fork");
		return 2;
	}
	if (pid == 0) {
		if ((fd = open("/dev/null", O_WRONLY)) >= 0) {
			dup2(fd, 1);
			dup2(fd, 2);
		}
		execvp(argv[4], argv + 4);
		_exit(127);
	}
	for (;;) {
		w = waitpid(pid, &st, WNOHANG);
		if (w == pid) {
			printf("exited %d %s\n", WIFEXITED(st) ?
			    WEXITSTATUS(st) : 128 + WTERMSIG(st),
			    seen ? "seen" : "unseen");
			return 0;
		}
		if (present(argv[1], argv[2])) {
			seen = 1;
			break;
		}
		pause_us(20);
	}
	clock_gettime(CLOCK_MONOTONIC, &t0);
	if (delay < 0) {
		/* Not killed: how long from the temporary to the end. */
		waitpid(pid, &st, 0);
		clock_gettime(CLOCK_MONOTONIC, &t1);
		printf("exited %d seen %ld\n", WIFEXITED(st) ?
		    WEXITSTATUS(st) : 128 + WTERMSIG(st),
		    (long)((t1.tv_sec - t0.tv_sec) * 1000000L +
		    (t1.tv_nsec - t0.tv_nsec) / 1000));
		return 0;
	}
	pause_us(delay);
	kill(pid, SIGKILL);
	waitpid(pid, &st, 0);
	if (WIFSIGNALED(st) && WTERMSIG(st) == SIGKILL)
		printf("killed seen\n");
	else
		printf("exited %d seen\n", WIFEXITED(st) ? WEXITSTATUS(st) :
		    128 + WTERMSIG(st));
	return 0;
}
