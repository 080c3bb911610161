/*
 * colmap.c: header recognition.  A header is normalised (lower case, runs
 * of other characters to one '_'), split into words, and a trailing unit
 * word taken off.  Each field scores every column: its canonical name
 * scores highest, a name word from the field's synonym list next, a unit
 * that only that field uses last.  The best column wins; ties go to the
 * leftmost.
 */
#include <ctype.h>
#include <stdio.h>
#include <string.h>
#include <strings.h>

#include "colmap.h"
#include "cw.h"
#include "sampin.h"

const char *const colmap_field_name[CM_NFIELD] = {
	"device", "time", "voltage", "current", "temp", "soc", "date"
};

/*
 * The canonical names are the sample stream's own (sampin_colname[], the
 * one table of the stream's columns); the stream has no date column.
 */
typedef char colmap_fields_follow_the_stream[
    (int)CM_DEVICE == (int)SAMP_DEVICE && (int)CM_TIME == (int)SAMP_TIME &&
    (int)CM_VOLTAGE == (int)SAMP_VOLTAGE &&
    (int)CM_CURRENT == (int)SAMP_CURRENT && (int)CM_TEMP == (int)SAMP_TEMP &&
    (int)CM_SOC == (int)SAMP_SOC && (int)CM_DATE == (int)SAMP_EXTRA ?
    1 : -1];

static const char *
canonical(int f)
{
	return f == CM_DATE ? "date" : sampin_colname[f];
}

/*
 * Name words per field, space separated.  A word in name_words[] counts
 * anywhere in a header ("pack_voltage"); one in name_whole[] only as the whole
 * name ("pack"), because it is too common a part of other names
 * ("battery_temp" is no device).
 */
static const char *const name_words[CM_NFIELD] = {
	(" device dev devid deviceid id serial sn packid batteryid asset "
	    "unitid vehicle bike terminal "),
	" time timestamp ts datetime epoch utc clock stamp ",
	" voltage volt volts vbat vpack vbatt packv ",
	" current curr amps amp ibat ipack ibatt packi ",
	" temp temperature tmp therm thermistor tbat tpack tcell celltemp ",
	" soc rsoc asoc stateofcharge chargelevel battlevel socpct ",
	" date day ",
};

static const char *const name_whole[CM_NFIELD] = {
	" pack battery batt unit node name ",
	" t ",
	" v ",
	" i ",
	" ",
	" level ",
	" ",
};

struct unitword {
	const char *word;
	int field;	/* the field the unit implies */
	int unit;
};

static const struct unitword units[] = {
	{ "iso", CM_TIME, CMU_ISO }, { "s", CM_TIME, CMU_S },
	{ "sec", CM_TIME, CMU_S }, { "ms", CM_TIME, CMU_MS },
	{ "us", CM_TIME, CMU_US },
	{ "v", CM_VOLTAGE, CMU_V }, { "mv", CM_VOLTAGE, CMU_MV },
	{ "a", CM_CURRENT, CMU_A }, { "ma", CM_CURRENT, CMU_MA },
	{ "c", CM_TEMP, CMU_C }, { "degc", CM_TEMP, CMU_C },
	{ "celsius", CM_TEMP, CMU_C }, { "f", CM_TEMP, CMU_F },
	{ "degf", CM_TEMP, CMU_F }, { "fahrenheit", CM_TEMP, CMU_F },
	{ "k", CM_TEMP, CMU_K }, { "kelvin", CM_TEMP, CMU_K },
	{ "dk", CM_TEMP, CMU_DK }, { "dc", CM_TEMP, CMU_DC },
	{ "pct", CM_SOC, CMU_PCT }, { "percent", CM_SOC, CMU_PCT },
	{ "frac", CM_SOC, CMU_FRAC }, { "fraction", CM_SOC, CMU_FRAC },
};
#define NUNITS (sizeof(units) / sizeof(units[0]))

/* -c unit names, per field. */
struct specunit {
	int field;
	const char *name;
	int unit;
};

static const struct specunit specunits[] = {
	{ CM_TIME, "iso", CMU_ISO }, { CM_TIME, "s", CMU_S },
	{ CM_TIME, "ms", CMU_MS }, { CM_TIME, "us", CMU_US },
	{ CM_VOLTAGE, "V", CMU_V }, { CM_VOLTAGE, "mV", CMU_MV },
	{ CM_CURRENT, "A", CMU_A }, { CM_CURRENT, "mA", CMU_MA },
	{ CM_TEMP, "C", CMU_C }, { CM_TEMP, "F", CMU_F },
	{ CM_TEMP, "K", CMU_K }, { CM_TEMP, "dK", CMU_DK },
	{ CM_TEMP, "dC", CMU_DC },
	{ CM_SOC, "pct", CMU_PCT }, { CM_SOC, "frac", CMU_FRAC },
};
#define NSPECUNITS (sizeof(specunits) / sizeof(specunits[0]))

static void normalise(const char *, char *, size_t);
static int score(int, const char *, int *);
static int has_word(const char *, const char *, size_t);

const char *
colmap_unit_name(int unit)
{
	size_t i;

	for (i = 0; i < NSPECUNITS; i++)
		if (specunits[i].unit == unit)
			return specunits[i].name;
	return unit == CMU_EPOCH ? "auto" : "default";
}

int
colmap_parse_spec(const char *spec, struct colmap_spec *s,
    const char **err)
{
	static char buf[1024];
	char *p, *next, *eq, *colon;
	size_t i;
	int f;

	memset(s, 0, sizeof(*s));
	if (strlen(spec) >= sizeof(buf)) {
		*err = "column spec too long";
		return -1;
	}
	strcpy(buf, spec);
	for (p = buf; p != NULL && *p != '\0'; p = next) {
		next = strchr(p, ',');
		if (next != NULL)
			*next++ = '\0';
		eq = strchr(p, '=');
		if (eq == NULL || eq == p || eq[1] == '\0') {
			*err = "expected field=header[:unit]";
			return -1;
		}
		*eq = '\0';
		for (f = 0; f < CM_NFIELD; f++)
			if (strcmp(p, colmap_field_name[f]) == 0)
				break;
		if (f == CM_NFIELD) {
			*err = "unknown field (device, time, date, voltage, "
			    "current, temp, soc)";
			return -1;
		}
		/* The unit is after the last colon, if that names a unit. */
		colon = strrchr(eq + 1, ':');
		if (colon != NULL) {
			for (i = 0; i < NSPECUNITS; i++)
				if (specunits[i].field == f &&
				    strcasecmp(colon + 1, specunits[i].name)
				    == 0)
					break;
			if (i == NSPECUNITS) {
				*err = "unknown unit for this field";
				return -1;
			}
			s->unit[f] = specunits[i].unit;
			*colon = '\0';
		}
		if (eq[1] == '\0') {
			*err = "empty header name";
			return -1;
		}
		s->header[f] = eq + 1;
	}
	return 0;
}

/* Lower case, other characters to single '_', "0.1k" to "dk". */
static void
normalise(const char *h, char *out, size_t cap)
{
	size_t n = 0;
	int under = 1;

	for (; *h != '\0' && n + 2 < cap; h++) {
		unsigned char c = (unsigned char)*h;

		if (strncmp(h, "0.1", 3) == 0 && (h[3] == 'K' || h[3] == 'k' ||
		    h[3] == 'C' || h[3] == 'c')) {
			if (!under)
				out[n++] = '_';
			out[n++] = 'd';
			h += 2;
			under = 0;
			continue;
		}
		if (c == 0xC2 && (unsigned char)h[1] == 0xB0) {	/* degree */
			h++;
			continue;
		}
		if (isalnum(c)) {
			out[n++] = (char)tolower(c);
			under = 0;
		} else if (!under) {
			out[n++] = '_';
			under = 1;
		}
	}
	while (n > 0 && out[n - 1] == '_')
		n--;
	out[n] = '\0';
}

static int
has_word(const char *list, const char *w, size_t n)
{
	const char *p = list;

	if (n == 0)
		return 0;
	while ((p = strstr(p, w)) != NULL) {
		if (p[-1] == ' ' && p[n] == ' ')
			return 1;
		p++;
	}
	return 0;
}

/*
 * How well normalised header NAME fits field F: 100 canonical, 60 the
 * whole name is a synonym, 50 a word is, 30 only the unit says so; 0 not
 * at all.  *UNIT gets the unit its suffix names.
 */
static int
score(int f, const char *name, int *unit)
{
	char words[256], *w, *last, joined[256];
	size_t i, n;
	int best = 0, uf = -1;

	static const int canonical_unit[CM_NFIELD] = {
		CMU_NONE, CMU_NONE, CMU_V, CMU_A, CMU_C, CMU_PCT, CMU_NONE
	};

	*unit = CMU_NONE;
	if (strcmp(name, canonical(f)) == 0) {
		*unit = canonical_unit[f];
		return 100;
	}
	snprintf(words, sizeof(words), "%s", name);
	last = strrchr(words, '_');
	if (last != NULL) {
		for (i = 0; i < NUNITS; i++)
			if (strcmp(last + 1, units[i].word) == 0) {
				uf = units[i].field;
				if (uf == f)
					*unit = units[i].unit;
				*last = '\0';
				break;
			}
	}
	if (uf >= 0 && uf != f)
		return 0;	/* the unit belongs to another field */
	/* The whole name without separators, then each word. */
	for (n = 0, w = words; *w != '\0'; w++)
		if (*w != '_')
			joined[n++] = *w;
	joined[n] = '\0';
	if (has_word(name_words[f], joined, n) ||
	    has_word(name_whole[f], joined, n))
		best = 60;
	if (best == 0) {
		char *save = NULL;

		for (w = strtok_r(words, "_", &save); w != NULL;
		    w = strtok_r(NULL, "_", &save))
			if (has_word(name_words[f], w, strlen(w))) {
				best = 50;
				break;
			}
	}
	if (best == 0 && uf == f && f != CM_TIME)
		best = 30;
	return best;
}

int
colmap_resolve(const struct colmap_spec *s, const struct csvin_rec *h,
    unsigned required, struct colmap *m)
{
	char norm[256];
	int f, unit;
	size_t i;

	for (f = 0; f < CM_NFIELD; f++) {
		m->col[f] = -1;
		m->unit[f] = s->unit[f];
		if (s->header[f] == NULL)
			continue;
		m->col[f] = csvin_find(h, s->header[f]);
		if (m->col[f] < 0)
			for (i = 0; i < h->nf; i++)
				if (strcasecmp(h->f[i], s->header[f]) == 0) {
					m->col[f] = (int)i;
					break;
				}
	}
	/*
	 * Score every (field, column) pair, then hand out the best pair
	 * left, again and again: a column serves one field, a field takes
	 * one column, ties go to the leftmost column.
	 */
	for (;;) {
		int bf = -1, bi = -1, bs = 0, bu = CMU_NONE;

		for (i = 0; i < h->nf; i++) {
			int used = 0;

			for (f = 0; f < CM_NFIELD; f++)
				if (m->col[f] == (int)i)
					used = 1;
			if (used)
				continue;
			normalise(h->f[i], norm, sizeof(norm));
			for (f = 0; f < CM_NFIELD; f++) {
				int sc;

				if (m->col[f] >= 0 || s->header[f] != NULL)
					continue;
				sc = score(f, norm, &unit);
				if (sc > bs) {
					bs = sc;
					bf = f;
					bi = (int)i;
					bu = unit;
				}
			}
		}
		if (bf < 0)
			break;
		m->col[bf] = bi;
		if (s->unit[bf] == CMU_NONE)
			m->unit[bf] = bu;
	}
	/* A lone date column holds the whole time stamp. */
	if (m->col[CM_TIME] < 0 && m->col[CM_DATE] >= 0 &&
	    s->header[CM_DATE] == NULL) {
		m->col[CM_TIME] = m->col[CM_DATE];
		m->col[CM_DATE] = -1;
	}
	for (f = 0; f < CM_NFIELD; f++) {
		if (m->col[f] >= 0 || !(required & (1u << f)))
			continue;
		{
			char seen[512] = "";
			size_t k;

			for (k = 0; k < h->nf && strlen(seen) < 400; k++) {
				if (k > 0)
					strcat(seen, ", ");
				strncat(seen, h->f[k], 60);
			}
			if (s->header[f] != NULL)
				cw_warn_at(h->src, h->line, "no column '%s' for "
				    "%s; headers seen: %s", s->header[f],
				    colmap_field_name[f], seen);
			else
				cw_warn_at(h->src, h->line, "cannot find the %s "
				    "column; headers seen: %s (name it with -c "
				    "%s=HEADER[:UNIT]%s)", colmap_field_name[f],
				    seen, colmap_field_name[f], f == CM_DEVICE ?
				    ", or give --device NAME or --device @file" :
				    "");
		}
		return -1;
	}
	/* Defaults where neither -c nor the name told the unit. */
	if (m->unit[CM_TIME] == CMU_NONE)
		m->unit[CM_TIME] = CMU_EPOCH;	/* ISO is seen by its '-' */
	if (m->unit[CM_VOLTAGE] == CMU_NONE)
		m->unit[CM_VOLTAGE] = CMU_V;
	if (m->unit[CM_CURRENT] == CMU_NONE)
		m->unit[CM_CURRENT] = CMU_A;
	if (m->unit[CM_TEMP] == CMU_NONE)
		m->unit[CM_TEMP] = CMU_C;
	if (m->unit[CM_SOC] == CMU_NONE)
		m->unit[CM_SOC] = CMU_PCT;
	return 0;
}
