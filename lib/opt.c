/* opt.c: validated option values (numbers, temperatures, durations). */
#include <getopt.h>
#include <math.h>
#include <string.h>

#include "num.h"
#include "opt.h"

double
opt_num_arg(const char *opt, const char *s, double lo, double hi)
{
	double x;

	if (num_parse_str(s, &x) != NUM_OK)
		cw_usage_error("%s: '%s' is not a number", opt, s);
	if (x < lo || x > hi)
		cw_usage_error("%s: %s is outside %g..%g", opt, s, lo, hi);
	return x;
}

double
opt_pos_arg(const char *opt, const char *s, double hi)
{
	double x = opt_num_arg(opt, s, 0, hi);

	if (!(x > 0))
		cw_usage_error("%s: %s is not above 0", opt, s);
	return x;
}

double
opt_open_arg(const char *opt, const char *s, double lo, double hi)
{
	double x = opt_num_arg(opt, s, lo, hi);

	if (x <= lo || x >= hi)
		cw_usage_error("%s: %s is not between %g and %g (exclusive)",
		    opt, s, lo, hi);
	return x;
}

long
opt_long_arg(const char *opt, const char *s, long lo, long hi)
{
	double x;

	/* No (long) cast before the value is known to fit: that is
	 * undefined behaviour for 1e30. */
	if (num_parse_str(s, &x) != NUM_OK || x != floor(x) || fabs(x) > 9e18)
		cw_usage_error("%s: '%s' is not a whole number", opt, s);
	if (x < lo || x > hi)
		cw_usage_error("%s: %s is outside %ld..%ld", opt, s, lo, hi);
	return (long)x;
}

int
opt_temp(const char *s, double *c)
{
	size_t n = strlen(s);
	char u = 'C';
	double x;

	if (n > 0 && strchr("CcFfKk", s[n - 1]) != NULL) {
		u = s[n - 1];
		n--;
	}
	if (num_parse(s, n, '.', &x) != NUM_OK)
		return -1;
	switch (u) {
	case 'F':
	case 'f':
		x = (x - 32.0) * 5.0 / 9.0;
		break;
	case 'K':
	case 'k':
		if (x < 0)
			return -1;
		x -= 273.15;
		break;
	}
	if (x < -273.15)
		return -1;
	/*
	 * Round away the last-place error of the conversion (26.6F must be
	 * -3 C exactly, or a reading of -3 C falls on the wrong side).
	 */
	*c = round(x * 1e9) / 1e9;
	return 0;
}

double
opt_temp_arg(const char *opt, const char *s)
{
	double c;

	if (opt_temp(s, &c) < 0)
		cw_usage_error("%s: '%s' is not a temperature (e.g. 10, 10C, "
		    "50F, 283.15K)", opt, s);
	return c;
}

int
opt_tempdiff(const char *s, double *c)
{
	size_t n = strlen(s);
	double x, mul = 1.0;

	if (n > 0 && strchr("CcKk", s[n - 1]) != NULL)
		n--;
	else if (n > 0 && (s[n - 1] == 'F' || s[n - 1] == 'f')) {
		mul = 5.0 / 9.0;
		n--;
	}
	if (num_parse(s, n, '.', &x) != NUM_OK || x < 0 || x * mul > 50)
		return -1;
	/* Rounded as opt_temp() rounds: 0.9F is 0.5 C exactly. */
	*c = round(x * mul * 1e9) / 1e9;
	return 0;
}

double
opt_tempdiff_arg(const char *opt, const char *s)
{
	double c;

	if (opt_tempdiff(s, &c) < 0)
		cw_usage_error("%s: '%s' is not a temperature difference "
		    "within 0..50 C (e.g. 0.5, 0.5C, 1F)", opt, s);
	return c;
}

int
opt_dur(const char *s, cw_time *us)
{
	size_t n = strlen(s);
	double x, mul = 1.0;

	if (n > 0) {
		switch (s[n - 1]) {
		case 's':
			n--;
			break;
		case 'm':
			mul = 60;
			n--;
			break;
		case 'h':
			mul = 3600;
			n--;
			break;
		case 'd':
			mul = 86400;
			n--;
			break;
		}
	}
	if (num_parse(s, n, '.', &x) != NUM_OK || x < 0 || x * mul > 1e11)
		return -1;
	*us = (cw_time)(x * mul * 1e6 + 0.5);
	return 0;
}

cw_time
opt_dur_arg(const char *opt, const char *s, int zero_ok)
{
	cw_time us;

	if (opt_dur(s, &us) < 0)
		cw_usage_error("%s: '%s' is not a duration (e.g. 90, 90s, 15m, "
		    "2h, 1d)", opt, s);
	if (!zero_ok && us == 0)
		cw_usage_error("%s: the duration must be above 0", opt);
	return us;
}

void
opt_list_arg(const char *opt, const char *s, double *out, int n, int temp,
    int nondecreasing)
{
	char buf[256], *p, *q = NULL;
	int k = 0;

	if (strlen(s) >= sizeof(buf))
		cw_usage_error("%s: value too long", opt);
	strcpy(buf, s);
	for (p = buf; k < n; p = q + 1) {
		q = strchr(p, ',');
		if (q != NULL)
			*q = '\0';
		if (temp) {
			if (opt_temp(p, &out[k]) < 0)
				cw_usage_error("%s: '%s' is not a temperature",
				    opt, p);
		} else if (num_parse_str(p, &out[k]) != NUM_OK)
			cw_usage_error("%s: '%s' is not a number", opt, p);
		if (nondecreasing && k > 0 && out[k] < out[k - 1])
			cw_usage_error("%s: values must not decrease", opt);
		k++;
		if (q == NULL)
			break;
	}
	if (k != n || q != NULL)
		cw_usage_error("%s: expected %d comma-separated values, got "
		    "'%s'", opt, n, s);
}

void
opt_getopt_fail(int ch, char *const argv[])
{
	const char *arg = optind > 0 ? argv[optind - 1] : "";
	int shortopt = optopt > 0 && optopt < 256 && strncmp(arg, "--", 2) != 0;

	if (ch == ':') {
		if (shortopt)
			cw_usage_error("option '-%c' needs a value", optopt);
		cw_usage_error("option '%s' needs a value", arg);
	}
	if (shortopt)
		cw_usage_error("unknown option '-%c'", optopt);
	cw_usage_error("unknown option '%s'", arg);
}
