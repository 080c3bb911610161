/*
 * fleet.h: the fleet file (asset register), one row per pack, that every
 * tool taking --fleet reads through this module; see cellwear(7).
 * Columns by header name in any order, all but device optional, unknown
 * ones ignored: device, capacity_ah, cells, in_service, soh_pct,
 * efc_prior, site, model.  An empty field is "not given": the tool's
 * option applies to that pack.  A bad value, a repeated device or a
 * missing device column is an error (FILE:LINE) with exit status 1.
 */
#ifndef FLEET_H
#define FLEET_H

#include <stddef.h>
#include "cw.h"
#include "devtab.h"

/* Which fields a row gave. */
enum {
	FLEET_CAPACITY = 1u << 0,
	FLEET_CELLS = 1u << 1,
	FLEET_IN_SERVICE = 1u << 2,
	FLEET_SOH = 1u << 3,
	FLEET_EFC_PRIOR = 1u << 4,
	FLEET_SITE = 1u << 5,
	FLEET_MODEL = 1u << 6
};

struct fleet_pack {
	struct devent de;	/* de.name: the device */
	unsigned have;		/* FLEET_ bits */
	unsigned long line;	/* line of the row, for messages */
	double capacity_ah;	/* rated capacity, > 0 */
	int cells;		/* cells in series, 1..1000 */
	cw_time in_service;	/* date or time it entered service */
	double soh_pct;		/* measured SoH at the log's start, (0, 150] */
	double efc_prior;	/* equivalent full cycles before the log, >= 0 */
	const char *site;	/* "" when not given */
	const char *model;
};

struct fleet;

/*
 * Read PATH (plain or gzip, any delimiter of ',', ';', tab, '|').  On an
 * error it reports and exits with CW_EXIT_DATA (cw_die), so an output file
 * not yet committed is removed.
 */
/* PATH NULL: no fleet file, NULL. */
struct fleet *fleet_load(const char *path);
/* The pack named NAME[0..LEN), or NULL (also when F is NULL). */
const struct fleet_pack *fleet_find(const struct fleet *f, const char *name,
	    size_t len);
size_t	fleet_count(const struct fleet *f);
/*
 * The per-pack value when the file gives it, else DFLT: the rule of
 * "a per-pack value overrides the tool's option".
 */
double	fleet_capacity(const struct fleet *f, const char *name, size_t len,
	    double dflt);
int	fleet_cells(const struct fleet *f, const char *name, size_t len,
	    int dflt);
void	fleet_free(struct fleet *f);

#endif
