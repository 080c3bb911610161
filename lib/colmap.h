/*
 * colmap.h: which raw log column holds which field, in which unit.
 * Either given (-c field=header[:unit],...) or recognised from the header
 * by name: canonical names, common synonyms and unit suffixes such as
 * _mv, _ma, _f, "(mV)" or "[0.1K]".
 */
#ifndef COLMAP_H
#define COLMAP_H

#include "csvin.h"

enum colmap_field {
	CM_DEVICE, CM_TIME, CM_VOLTAGE, CM_CURRENT, CM_TEMP, CM_SOC,
	CM_DATE,	/* a date column beside a time-of-day column */
	CM_NFIELD
};

enum colmap_unit {
	CMU_NONE,	/* not given: the field's default */
	CMU_ISO, CMU_S, CMU_MS, CMU_US, CMU_EPOCH,	/* time; EPOCH: by size */
	CMU_V, CMU_MV,
	CMU_A, CMU_MA,
	CMU_C, CMU_F, CMU_K, CMU_DK, CMU_DC,
	CMU_PCT, CMU_FRAC
};

struct colmap_spec {
	const char *header[CM_NFIELD];	/* NULL: recognise by name */
	int unit[CM_NFIELD];		/* CMU_NONE: from the name or default */
};

struct colmap {
	int col[CM_NFIELD];	/* column index, -1 when absent */
	int unit[CM_NFIELD];	/* resolved unit */
};

extern const char *const colmap_field_name[CM_NFIELD];

/* Parse a -c SPEC into S; 0, or -1 with *ERR set to a message. */
int	colmap_parse_spec(const char *spec, struct colmap_spec *s,
	    const char **err);
/*
 * Resolve the header H with S.  Fields in REQUIRED (bit per field) must be
 * found; returns 0, or -1 after reporting "FILE:LINE: cannot find ..."
 * with the headers seen.
 */
int	colmap_resolve(const struct colmap_spec *s, const struct csvin_rec *h,
	    unsigned required, struct colmap *m);
const char *colmap_unit_name(int unit);

#endif
