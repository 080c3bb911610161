/*
 * ocv.h: an open-circuit-voltage table (the cell's rest voltage against
 * its SoC) that the user gives, read from CSV with columns soc_pct and
 * voltage_v (per cell, in volts; any order, other columns ignored), and
 * its inverse: the SoC of a rested voltage, by linear interpolation.
 * The table must rise: voltages strictly increasing with the SoC.
 */
#ifndef OCV_H
#define OCV_H

#include <stddef.h>

/* Points at most in a table. */
#define OCV_MAX 1024

struct ocv {
	size_t n;
	double soc[OCV_MAX];	/* percent, increasing */
	double v[OCV_MAX];	/* volts per cell, increasing */
};

/*
 * Read PATH (plain or gzip) into a new table.  A bad value, a missing
 * column, fewer than two points, more than OCV_MAX or a table that does
 * not rise is an error (FILE:LINE) with exit status 1 (cw_die).
 */
struct ocv *ocv_load(const char *path);
/* The SoC in percent at cell voltage V, NaN outside the table. */
double	ocv_soc(const struct ocv *o, double v);
void	ocv_free(struct ocv *o);

#endif
