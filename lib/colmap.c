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
#include <stdlib.h>
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
 * Name words per field.  A word that is not WHOLE counts anywhere in a
 * header ("pack_voltage"); a WHOLE one only as the whole name ("pack"),
 * because it is too common a part of other names ("battery_temp" is no
 * device).  Every word is lower-case letters, as normalise() leaves a
 * header, and is found through a hash table (key_find()).
 */
struct nameword {
	const char *word;
	unsigned char len;
	unsigned char field;
	unsigned char whole;
};

#define NW(w, f, whole) { w, sizeof(w) - 1, f, whole }
static const struct nameword namewords[] = {
	NW("device", CM_DEVICE, 0), NW("dev", CM_DEVICE, 0),
	NW("devid", CM_DEVICE, 0), NW("deviceid", CM_DEVICE, 0),
	NW("id", CM_DEVICE, 0), NW("serial", CM_DEVICE, 0),
	NW("sn", CM_DEVICE, 0), NW("packid", CM_DEVICE, 0),
	NW("batteryid", CM_DEVICE, 0), NW("asset", CM_DEVICE, 0),
	NW("unitid", CM_DEVICE, 0), NW("vehicle", CM_DEVICE, 0),
	NW("bike", CM_DEVICE, 0), NW("terminal", CM_DEVICE, 0),
	NW("pack", CM_DEVICE, 1), NW("battery", CM_DEVICE, 1),
	NW("batt", CM_DEVICE, 1), NW("unit", CM_DEVICE, 1),
	NW("node", CM_DEVICE, 1), NW("name", CM_DEVICE, 1),
	NW("time", CM_TIME, 0), NW("timestamp", CM_TIME, 0),
	NW("ts", CM_TIME, 0), NW("datetime", CM_TIME, 0),
	NW("epoch", CM_TIME, 0), NW("utc", CM_TIME, 0),
	NW("clock", CM_TIME, 0), NW("stamp", CM_TIME, 0),
	NW("t", CM_TIME, 1),
	NW("voltage", CM_VOLTAGE, 0), NW("volt", CM_VOLTAGE, 0),
	NW("volts", CM_VOLTAGE, 0), NW("vbat", CM_VOLTAGE, 0),
	NW("vpack", CM_VOLTAGE, 0), NW("vbatt", CM_VOLTAGE, 0),
	NW("packv", CM_VOLTAGE, 0), NW("v", CM_VOLTAGE, 1),
	NW("current", CM_CURRENT, 0), NW("curr", CM_CURRENT, 0),
	NW("amps", CM_CURRENT, 0), NW("amp", CM_CURRENT, 0),
	NW("ibat", CM_CURRENT, 0), NW("ipack", CM_CURRENT, 0),
	NW("ibatt", CM_CURRENT, 0), NW("packi", CM_CURRENT, 0),
	NW("i", CM_CURRENT, 1),
	NW("temp", CM_TEMP, 0), NW("temperature", CM_TEMP, 0),
	NW("tmp", CM_TEMP, 0), NW("therm", CM_TEMP, 0),
	NW("thermistor", CM_TEMP, 0), NW("tbat", CM_TEMP, 0),
	NW("tpack", CM_TEMP, 0), NW("tcell", CM_TEMP, 0),
	NW("celltemp", CM_TEMP, 0),
	NW("soc", CM_SOC, 0), NW("rsoc", CM_SOC, 0), NW("asoc", CM_SOC, 0),
	NW("stateofcharge", CM_SOC, 0), NW("chargelevel", CM_SOC, 0),
	NW("battlevel", CM_SOC, 0), NW("socpct", CM_SOC, 0),
	NW("level", CM_SOC, 1),
	NW("date", CM_DATE, 0), NW("day", CM_DATE, 0),
};
#undef NW
#define NNAMEWORDS (sizeof(namewords) / sizeof(namewords[0]))

/* A header's last word that names a unit: _mv, _degc, ... */
struct unitword {
	const char *word;
	size_t len;
	int field;	/* the field the unit implies */
	int unit;
};

#define UW(w, f, u) { w, sizeof(w) - 1, f, u }
static const struct unitword units[] = {
	UW("iso", CM_TIME, CMU_ISO), UW("s", CM_TIME, CMU_S),
	UW("sec", CM_TIME, CMU_S), UW("ms", CM_TIME, CMU_MS),
	UW("us", CM_TIME, CMU_US),
	UW("v", CM_VOLTAGE, CMU_V), UW("mv", CM_VOLTAGE, CMU_MV),
	UW("a", CM_CURRENT, CMU_A), UW("ma", CM_CURRENT, CMU_MA),
	UW("c", CM_TEMP, CMU_C), UW("degc", CM_TEMP, CMU_C),
	UW("celsius", CM_TEMP, CMU_C), UW("f", CM_TEMP, CMU_F),
	UW("degf", CM_TEMP, CMU_F), UW("fahrenheit", CM_TEMP, CMU_F),
	UW("k", CM_TEMP, CMU_K), UW("kelvin", CM_TEMP, CMU_K),
	UW("dk", CM_TEMP, CMU_DK), UW("dc", CM_TEMP, CMU_DC),
	UW("pct", CM_SOC, CMU_PCT), UW("percent", CM_SOC, CMU_PCT),
	UW("frac", CM_SOC, CMU_FRAC), UW("fraction", CM_SOC, CMU_FRAC),
};
#undef UW
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

/* A (column, field) pair that scores, for the hand-out. */
struct cand {
	size_t col;
	unsigned char field, score, unit;
};

static size_t normalise(const char *, char *, size_t);
struct key;
static void key_make(size_t, struct key *);
static int key_find(unsigned, const char *, size_t, int);
static unsigned key_field(int);
static int score_col(const char *, size_t, int *, int *);

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

/*
 * Lower case, other characters to single '_', "0.1k" to "dk"; the
 * length.
 */
static size_t
normalise(const char *h, char *out, size_t cap)
{
	size_t n = 0;
	int under = 1;

	for (; *h != '\0' && n + 2 < cap; h++) {
		unsigned char c = (unsigned char)*h;

		if (h[0] == '0' && h[1] == '.' && h[2] == '1' && (h[3] == 'K' || h[3] == 'k' ||
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
	return n;
}

/*
 * The words a normalised header is made of, found through one hash
 * table built by the first call (the tools resolve headers on their main
 * thread only): the name words, the unit words and the canonical names,
 * keys 0.. in that order.  A header's column costs one pass over its
 * name and a probe or two per word, where scanning the lists cost a
 * comparison per listed word.
 */
enum { K_WORD = 1, K_WHOLE = 2, K_UNIT = 4, K_CANON = 8 };
#define NKEYS (NNAMEWORDS + NUNITS + CM_NFIELD)
#define NSLOTS 256	/* more than twice the keys: short probes */
#define FNV_INIT 2166136261u
#define FNV_STEP(h, c) (((h) ^ (unsigned char)(c)) * 16777619u)
typedef char colmap_keys_fit_the_slots[NKEYS < 255 && 2 * NKEYS < NSLOTS ?
    1 : -1];

/* A key as the table holds it. */
struct key {
	const char *word;
	size_t len;
	int kind;
};

static void
key_make(size_t k, struct key *e)
{
	if (k < NNAMEWORDS) {
		e->kind = namewords[k].whole ? K_WHOLE : K_WORD;
		e->word = namewords[k].word;
		e->len = namewords[k].len;
	} else if (k < NNAMEWORDS + NUNITS) {
		e->kind = K_UNIT;
		e->word = units[k - NNAMEWORDS].word;
		e->len = units[k - NNAMEWORDS].len;
	} else {
		e->kind = K_CANON;
		e->word = canonical((int)(k - NNAMEWORDS - NUNITS));
		e->len = strlen(e->word);
	}
}

/* The key of kind in KINDS spelt W[0..N), whose hash is H; -1 if none. */
static int
key_find(unsigned h, const char *w, size_t n, int kinds)
{
	static struct key keys[NKEYS];
	static unsigned char slot[NSLOTS];	/* key + 1, 0 empty */
	static int built;
	const struct key *e;
	size_t k;

	if (!built) {
		for (k = 0; k < NKEYS; k++) {
			unsigned kh = FNV_INIT;
			size_t i;

			key_make(k, &keys[k]);
			for (i = 0; i < keys[k].len; i++)
				kh = FNV_STEP(kh, keys[k].word[i]);
			for (kh &= NSLOTS - 1; slot[kh] != 0;
			    kh = (kh + 1) & (NSLOTS - 1))
				;
			slot[kh] = (unsigned char)(k + 1);
		}
		built = 1;
	}
	for (h &= NSLOTS - 1; slot[h] != 0; h = (h + 1) & (NSLOTS - 1)) {
		e = &keys[slot[h] - 1];
		if ((e->kind & kinds) && e->len == n &&
		    memcmp(e->word, w, n) == 0)
			return slot[h] - 1;
	}
	return -1;
}

/* The field a name word names, as a bit; 0 when K is none. */
static unsigned
key_field(int k)
{
	return k >= 0 ? 1u << namewords[k].field : 0;
}

/*
 * How well the normalised header NAME[0..LEN) fits each field, into
 * SC[f]: 100 canonical, 60 the whole name is a synonym, 50 a word is,
 * 30 only the unit says so; 0 not at all.  UNIT[f] gets the unit its
 * suffix names for that field.  A last word (after a '_') that names a
 * unit is taken off the name first, and a unit of another field scores
 * 0.  Returns 0 when no field scores (SC and UNIT then untouched).
 */
static int
score_col(const char *name, size_t len, int *sc, int *unit)
{
	static const int canonical_unit[CM_NFIELD] = {
		CMU_NONE, CMU_NONE, CMU_V, CMU_A, CMU_C, CMU_PCT, CMU_NONE
	};
	char joined[256];
	unsigned nh = FNV_INIT, jh = FNV_INIT, th = FNV_INIT, jh_cut = 0;
	unsigned whole, words = 0, words_cut = 0;
	size_t i, jn = 0, jn_cut = 0, start = 0;
	int f, k, canon = -1, cut = 0, uf = -1, uu = CMU_NONE;

	/*
	 * One pass: the name's hash, its words (each looked up), and the
	 * name without '_' (joined); the state at the last '_' is what is
	 * left when the last word is a unit.
	 */
	for (i = 0; i < len; i++) {
		nh = FNV_STEP(nh, name[i]);
		if (name[i] != '_') {
			jh = FNV_STEP(jh, name[i]);
			th = FNV_STEP(th, name[i]);
			joined[jn++] = name[i];
			continue;
		}
		if (i > start)
			words |= key_field(key_find(th, name + start,
			    i - start, K_WORD));
		cut = 1;
		words_cut = words;
		jh_cut = jh;
		jn_cut = jn;
		th = FNV_INIT;
		start = i + 1;
	}
	if ((k = key_find(nh, name, len, K_CANON)) >= 0)
		canon = k - (int)(NNAMEWORDS + NUNITS);
	if (cut && (k = key_find(th, name + start, len - start, K_UNIT)) >= 0) {
		uf = units[k - (int)NNAMEWORDS].field;
		uu = units[k - (int)NNAMEWORDS].unit;
		words = words_cut;
		jh = jh_cut;
		jn = jn_cut;
	} else if (len > start)
		words |= key_field(key_find(th, name + start, len - start,
		    K_WORD));
	whole = jn > 0 ? key_field(key_find(jh, joined, jn, K_WORD |
	    K_WHOLE)) : 0;
	if (canon < 0 && uf < 0 && whole == 0 && words == 0)
		return 0;
	for (f = 0; f < CM_NFIELD; f++) {
		sc[f] = 0;
		unit[f] = CMU_NONE;
		if (f == canon) {
			sc[f] = 100;
			unit[f] = canonical_unit[f];
			continue;
		}
		if (uf >= 0 && uf != f)
			continue;	/* the unit belongs to another field */
		if (uf == f)
			unit[f] = uu;
		if (whole & (1u << f))
			sc[f] = 60;
		else if (words & (1u << f))
			sc[f] = 50;
		else if (uf == f && f != CM_TIME)
			sc[f] = 30;
	}
	return 1;
}

int
colmap_resolve(const struct colmap_spec *s, const struct csvin_rec *h,
    unsigned required, struct colmap *m)
{
	static const unsigned char levels[] = { 100, 60, 50, 30 };
	struct cand stack[64], *cand = stack;
	size_t ccap = sizeof(stack) / sizeof(stack[0]), nc = 0, j, lv;
	char norm[256];
	int f, nspec = 0;
	size_t i;

	for (f = 0; f < CM_NFIELD; f++) {
		m->col[f] = -1;
		m->unit[f] = s->unit[f];
		if (s->header[f] == NULL)
			continue;
		nspec++;
		m->col[f] = csvin_find(h, s->header[f]);
		if (m->col[f] < 0)
			for (i = 0; i < h->nf; i++)
				if (strcasecmp(h->f[i], s->header[f]) == 0) {
					m->col[f] = (int)i;
					break;
				}
	}
	/*
	 * Score every (field, column) pair once, then hand out the best
	 * pair left, again and again: a column serves one field, a field
	 * takes one column, ties go to the leftmost column (and the first
	 * field).  The pairs are listed by column and field, so taking
	 * each score level in turn down the list does that.
	 */
	for (i = 0; i < h->nf; i++) {
		int sc[CM_NFIELD], un[CM_NFIELD], used = 0;
		size_t len;

		for (f = 0; nspec > 0 && f < CM_NFIELD; f++)
			if (m->col[f] == (int)i)
				used = 1;
		if (used)
			continue;
		len = normalise(h->f[i], norm, sizeof(norm));
		if (!score_col(norm, len, sc, un))
			continue;
		for (f = 0; f < CM_NFIELD; f++) {
			if (sc[f] == 0 || s->header[f] != NULL)
				continue;
			if (nc == ccap) {
				ccap *= 2;
				if (cand == stack) {
					cand = cw_malloc(ccap * sizeof(*cand));
					memcpy(cand, stack, sizeof(stack));
				} else
					cand = cw_realloc(cand, ccap *
					    sizeof(*cand));
			}
			cand[nc].col = i;
			cand[nc].field = (unsigned char)f;
			cand[nc].score = (unsigned char)sc[f];
			cand[nc].unit = (unsigned char)un[f];
			nc++;
		}
	}
	for (lv = 0; lv < sizeof(levels) / sizeof(levels[0]); lv++)
		for (j = 0; j < nc; j++) {
			const struct cand *p = &cand[j];
			int g, used = 0;

			if (p->score != levels[lv] || m->col[p->field] >= 0)
				continue;
			for (g = 0; g < CM_NFIELD; g++)
				if (m->col[g] == (int)p->col)
					used = 1;
			if (used)
				continue;
			m->col[p->field] = (int)p->col;
			if (s->unit[p->field] == CMU_NONE)
				m->unit[p->field] = p->unit;
		}
	if (cand != stack)
		free(cand);
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
