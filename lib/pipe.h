/*
 * pipe.h: the size of a pipe between two tools.
 */
#ifndef PIPE_H
#define PIPE_H

#define PIPE_WIDE (1024 * 1024)	/* bytes asked for; Linux's default
				 * /proc/sys/fs/pipe-max-size */

int	pipe_widen(int fd);

#endif
