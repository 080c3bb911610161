/*
 * test_pipe.c: pipe_widen() (lib/pipe.c).
 *
 * What is checked is Linux's fcntl(2) behaviour as its manual page
 * describes F_GETPIPE_SZ and F_SETPIPE_SZ: a new pipe holds 16 pages
 * (65,536 bytes with 4 KiB pages), and it can be set up to
 * /proc/sys/fs/pipe-max-size (1,048,576 by default).
 */
#define _GNU_SOURCE		/* F_GETPIPE_SZ, F_SETPIPE_SZ */
#include <fcntl.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <unistd.h>
#include <cmocka.h>

#include "pipe.h"

/* /proc/sys/fs/pipe-max-size, or -1 where it cannot be read. */
static long
max_size(void)
{
	FILE *fp = fopen("/proc/sys/fs/pipe-max-size", "r");
	long n = -1;

	if (fp == NULL)
		return -1;
	if (fscanf(fp, "%ld", &n) != 1)
		n = -1;
	fclose(fp);
	return n;
}

/* A pipe, either end, is widened to PIPE_WIDE where the kernel allows it;
 * otherwise it keeps the size it had. */
static void
test_pipe_widened(void **state)
{
	int fd[2], before, after, end;
	long max = max_size();

	(void)state;
	for (end = 0; end < 2; end++) {
		assert_int_equal(pipe(fd), 0);
		before = fcntl(fd[end], F_GETPIPE_SZ);
		assert_true(before > 0);
		after = pipe_widen(fd[end]);
		assert_int_equal(after, fcntl(fd[end], F_GETPIPE_SZ));
		assert_int_equal(after, fcntl(fd[1 - end], F_GETPIPE_SZ));
		if (max >= PIPE_WIDE && before < PIPE_WIDE)
			assert_int_equal(after, PIPE_WIDE);
		else
			assert_int_equal(after, before);
		close(fd[0]);
		close(fd[1]);
	}
}

/* Twice is the same as once. */
static void
test_pipe_twice(void **state)
{
	int fd[2], once;

	(void)state;
	assert_int_equal(pipe(fd), 0);
	once = pipe_widen(fd[1]);
	assert_true(once > 0);
	assert_int_equal(pipe_widen(fd[1]), once);
	assert_int_equal(pipe_widen(fd[0]), once);
	close(fd[0]);
	close(fd[1]);
}

/* What is not a pipe is left alone: -1. */
static void
test_not_a_pipe(void **state)
{
	char path[] = "/tmp/test_pipe.XXXXXX";
	int fd = mkstemp(path);

	(void)state;
	assert_true(fd >= 0);
	unlink(path);
	assert_int_equal(pipe_widen(fd), -1);
	close(fd);
	assert_int_equal(pipe_widen(fd), -1);	/* closed: fstat fails */
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_pipe_widened),
		cmocka_unit_test(test_pipe_twice),
		cmocka_unit_test(test_not_a_pipe),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
