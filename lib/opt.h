/*
 * opt.h: option values, validated.  Each *_arg() function takes the option
 * name for its message and exits 2 (usage error) on a bad value.
 */
#ifndef OPT_H
#define OPT_H

#include "cw.h"

/* A number within [LO, HI]. */
double	opt_num_arg(const char *opt, const char *s, double lo, double hi);
/* A number above 0 and at most HI: "OPT: S is not above 0" below it. */
double	opt_pos_arg(const char *opt, const char *s, double hi);
/*
 * A number strictly between LO and HI: "OPT: S is not between LO and HI
 * (exclusive)" at either end.
 */
double	opt_open_arg(const char *opt, const char *s, double lo, double hi);
/* A whole number within [LO, HI]. */
long	opt_long_arg(const char *opt, const char *s, long lo, long hi);
/* A temperature with an optional unit suffix C, F or K; degrees Celsius. */
double	opt_temp_arg(const char *opt, const char *s);
/*
 * A temperature difference within 0..50 C, with an optional unit suffix:
 * C and K count the same step, F counts 5/9 of it (so 0.9F is 0.5 C, and
 * 1F is 0.556 C, not -17.2 C as an absolute temperature would be).
 * Rounded to 1e-9 C, as opt_temp() rounds.
 */
double	opt_tempdiff_arg(const char *opt, const char *s);
/* A duration: 90, 90s, 15m, 2h, 1d (fraction allowed), > 0 unless ZERO_OK. */
cw_time	opt_dur_arg(const char *opt, const char *s, int zero_ok);
/*
 * A comma-separated list of exactly N values, each a number (TEMP zero) or a
 * temperature (TEMP non-zero), into OUT.  NONDECREASING: values must not
 * decrease.
 */
void	opt_list_arg(const char *opt, const char *s, double *out, int n,
	    int temp, int nondecreasing);

/*
 * After getopt_long() returned ':' or '?' (opterr 0, an option string
 * that starts with ':'): a usage error naming the option, exit 2.
 */
_Noreturn void opt_getopt_fail(int ch, char *const argv[]);

/* Non-exiting forms: 0 or -1. */
int	opt_temp(const char *s, double *c);
int	opt_tempdiff(const char *s, double *c);
int	opt_dur(const char *s, cw_time *us);

#endif
