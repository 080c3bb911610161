/*
 * test_wearstate.c: joining cw-wear device states (wear_join, rf_join) and
 * their text form (lib/wearstate.c).
 *
 * References:
 * - ASTM E1049-85 (reapproved 2017), section 5.4.4, Fig. 6: the history
 *   -2, 1, -3, 5, -1, 3, -4, 4, -2 counts ranges 3, 4, 6, 8, 9 with 0.5,
 *   1.5, 0.5, 1.0, 0.5 cycles; cut anywhere into pieces counted apart and
 *   joined, it must count the same.
 * - One pass over the whole history, the definition of what a join must
 *   give (cw-wear(1), "State"): random histories cut at random rows into
 *   pieces, joined in time order and in other groupings, must give the
 *   cycles of one pass exactly (same ranges, means, counts, times and
 *   temperatures), and the same totals: counts exactly, sums to the
 *   rounding of adding in another order (1e-12 relative).
 * - IEEE 754 binary64 and C11 7.21.6.1: %.17g of a double reads back to
 *   the same double, so a state written and read continues bit for bit.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <fcntl.h>
#include <unistd.h>
#include <cmocka.h>

#include "rainflow.h"
#include "wear.h"
#include "wearstate.h"

#define T0 ((cw_time)1767225600 * CW_US_PER_S)	/* 2026-01-01 */
#define S CW_US_PER_S
#define MAXCYC 20000
#define MAXROW 4000
#define MAXPIECE 8

struct cycles {
	struct rf_cycle c[MAXCYC];
	size_t n;
};

struct sample {
	cw_time t;
	double v, i, temp, soc;
};

static struct cycles ONE, JOINED;
static struct sample ROWS[MAXROW];
static uint64_t seed = 0x2545F4914F6CDD1Dull;

/* splitmix64: a small PRNG with a fixed seed, so runs repeat. */
static uint64_t
rnd(void)
{
	uint64_t z = (seed += 0x9E3779B97F4A7C15ull);

	z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
	z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
	return z ^ (z >> 31);
}

static double
unif(void)
{
	return (double)(rnd() >> 11) / 9007199254740992.0;
}

static int
chance(double p)
{
	return unif() < p;
}

static void
collect(void *ctx, const struct rf_cycle *c)
{
	struct cycles *g = ctx;

	assert_true(g->n < MAXCYC);
	g->c[g->n++] = *c;
}

static int
cyc_cmp(const void *pa, const void *pb)
{
	const struct rf_cycle *a = pa, *b = pb;

	if (a->start != b->start)
		return a->start < b->start ? -1 : 1;
	if (a->end != b->end)
		return a->end < b->end ? -1 : 1;
	if (a->count != b->count)
		return a->count < b->count ? -1 : 1;
	return 0;
}

/* The same cycles, whatever the order they were counted in. */
static void
same_cycles(struct cycles *a, struct cycles *b)
{
	size_t k;

	qsort(a->c, a->n, sizeof(a->c[0]), cyc_cmp);
	qsort(b->c, b->n, sizeof(b->c[0]), cyc_cmp);
	assert_int_equal(a->n, b->n);
	for (k = 0; k < a->n; k++) {
		assert_true(a->c[k].range == b->c[k].range);
		assert_true(a->c[k].mean == b->c[k].mean);
		assert_true(a->c[k].count == b->c[k].count);
		assert_true(a->c[k].start == b->c[k].start);
		assert_true(a->c[k].end == b->c[k].end);
		assert_true(a->c[k].aux_mean == b->c[k].aux_mean ||
		    (isnan(a->c[k].aux_mean) && isnan(b->c[k].aux_mean)));
	}
}

/* History X[0..N) counted in pieces cut at CUT[0..NCUT) (increasing),
 * joined left to right, then paired and finished as a plain pass. */
static void
count_pieces(const double *x, const double *aux, size_t n, double h,
    const size_t *cut, size_t ncut, int residue, struct cycles *g)
{
	struct rf_state acc, piece, fresh;
	size_t p, k, lo, hi;

	g->n = 0;
	rf_init(&acc, h);
	acc.raw_start = 1;
	for (p = 0; p <= ncut; p++) {
		lo = p == 0 ? 0 : cut[p - 1];
		hi = p == ncut ? n : cut[p];
		rf_init(&piece, h);
		piece.raw_start = 1;
		for (k = lo; k < hi; k++)
			rf_push(&piece, (cw_time)k * S, x[k], aux[k], collect,
			    g);
		rf_join(&acc, &piece, collect, g);
		rf_free(&piece);
	}
	rf_init(&fresh, h);
	rf_join(&fresh, &acc, collect, g);
	rf_free(&acc);
	rf_finish(&fresh, residue, collect, g);
	rf_free(&fresh);
}

static void
count_once(const double *x, const double *aux, size_t n, double h,
    int residue, struct cycles *g)
{
	struct rf_state s;
	size_t k;

	g->n = 0;
	rf_init(&s, h);
	for (k = 0; k < n; k++)
		rf_push(&s, (cw_time)k * S, x[k], aux[k], collect, g);
	rf_finish(&s, residue, collect, g);
	rf_free(&s);
}

/* ASTM E1049-85 Fig. 6, cut into two and into three pieces anywhere. */
static void
test_rf_join_astm(void **st)
{
	static const double x[] = { -2, 1, -3, 5, -1, 3, -4, 4, -2 };
	static const double range[] = { 3, 4, 6, 8, 9 };
	static const double want[] = { 0.5, 1.5, 0.5, 1.0, 0.5 };
	double aux[9], got[5];
	size_t cut[2], a, b, k, j;

	(void)st;
	for (k = 0; k < 9; k++)
		aux[k] = 20 + (double)k;
	for (a = 1; a < 9; a++)
		for (b = a; b < 9; b++) {
			cut[0] = a;
			cut[1] = b;
			count_pieces(x, aux, 9, 0, cut, b == a ? 1 : 2,
			    RF_RESIDUE_HALF, &JOINED);
			memset(got, 0, sizeof(got));
			for (k = 0; k < JOINED.n; k++) {
				for (j = 0; j < 5; j++)
					if (JOINED.c[k].range == range[j])
						break;
				assert_true(j < 5);
				got[j] += JOINED.c[k].count;
			}
			for (j = 0; j < 5; j++)
				assert_true(got[j] == want[j]);
		}
}

/*
 * Random histories, some of integers in a narrow band (so that equal
 * ranges, plateaus and ties at the cuts are common), some of decimals:
 * every way of joining gives one pass's cycles, for each residue mode.
 */
static void
test_rf_join_random(void **st)
{
	static double x[600], aux[600];
	static const double hyst[] = { 0, 1, 2.5 };
	size_t cut[MAXPIECE], n, ncut, k, trial;
	int mode;

	(void)st;
	for (trial = 0; trial < 3000; trial++) {
		n = 2 + rnd() % 300;
		for (k = 0; k < n; k++) {
			if (trial % 3 == 0)
				x[k] = (double)(rnd() % 7);
			else if (trial % 3 == 1)
				x[k] = k ? x[k - 1] + (double)(rnd() % 9) - 4 :
				    50;
			else
				x[k] = k ? x[k - 1] + 10 * (unif() - 0.5) : 0;
			aux[k] = chance(0.1) ? CW_MISSING : 15 + 20 * unif();
		}
		ncut = rnd() % MAXPIECE;
		for (k = 0; k < ncut; k++)
			cut[k] = 1 + rnd() % (n - 1);
		for (k = 1; k < ncut; k++) {	/* sort the cuts */
			size_t j = k, t = cut[k];

			for (; j > 0 && cut[j - 1] > t; j--)
				cut[j] = cut[j - 1];
			cut[j] = t;
		}
		mode = (int)(trial % 3);
		count_once(x, aux, n, hyst[trial / 3 % 3], mode, &ONE);
		count_pieces(x, aux, n, hyst[trial / 3 % 3], cut, ncut, mode,
		    &JOINED);
		same_cycles(&ONE, &JOINED);
	}
}

/*
 * A random device: rides, charges to full with CC/CV and a charger that
 * tops up while docked, rest, gaps over max_gap, missing values, SoC as
 * integers, tenths or raw, times that repeat.
 */
static size_t
make_rows(struct sample *r, size_t max)
{
	size_t n = 50 + rnd() % (max - 50), k;
	double soc = 20 + 80 * unif(), temp = 5 + 40 * unif();
	int mode = 0, quant = (int)(rnd() % 3);
	cw_time t = T0 + (cw_time)(rnd() % 86400) * S;

	for (k = 0; k < n; k++) {
		double i;

		if (chance(0.02))
			mode = (int)(rnd() % 4);
		switch (mode) {
		case 0:		/* riding */
			i = -5 * unif() - 0.5;
			soc += i * 0.05;
			if (soc < 5)
				mode = 1;
			break;
		case 1:		/* charging, CV near the top */
			i = soc < 90 ? 3 : 3 * (100 - soc) / 10 + 0.02;
			soc += i * 0.08;
			if (soc >= 100) {
				soc = 100;
				mode = 2;
			}
			break;
		case 2:		/* docked: drifts down, topped up at 98 */
			i = -0.1;
			soc -= 0.3 * unif();
			if (soc < 98)
				mode = 3;
			break;
		default:	/* the top-up */
			i = 1.5;
			soc += 0.5;
			if (soc >= 100) {
				soc = 100;
				mode = 2;
			}
			break;
		}
		temp += unif() - 0.5;
		r[k].t = t;
		r[k].i = chance(0.03) ? CW_MISSING : i;
		r[k].v = chance(0.03) ? CW_MISSING : 3.3 + soc / 100;
		r[k].temp = chance(0.04) ? CW_MISSING : temp;
		r[k].soc = quant == 0 ? nearbyint(soc) : quant == 1 ?
		    nearbyint(soc * 10) / 10 : soc;
		if (chance(0.04))
			r[k].soc = CW_MISSING;
		if (chance(0.005))
			r[k].soc = 100.5;	/* out of range */
		/* Mostly a minute, sometimes the same time, sometimes a
		 * gap over max_gap. */
		t += chance(0.02) ? 0 : chance(0.01) ? (cw_time)(rnd() %
		    7200 + 901) * S : 60 * S;
	}
	return n;
}

static void
feed(struct wear_dev *d, const struct wear_conf *c, const struct sample *r,
    size_t lo, size_t hi)
{
	size_t k;

	for (k = lo; k < hi; k++)
		wear_push(d, c, r[k].t, r[k].v, r[k].i, r[k].temp, r[k].soc);
}

static void
near(double got, double want)
{
	if (!(got == want || fabs(got - want) <= 1e-12 * fabs(want))) {
		print_error("got %.17g, want %.17g\n", got, want);
		fail();
	}
}

/* The totals of two finished states: counts exact, sums up to rounding. */
static void
same_acc(const struct wear_acc *a, const struct wear_acc *b)
{
	int k;

	assert_int_equal(a->have, b->have);
	assert_true(a->first == b->first && a->last == b->last);
	assert_int_equal(a->rows, b->rows);
	assert_int_equal(a->rows_no_current, b->rows_no_current);
	assert_int_equal(a->rows_no_soc, b->rows_no_soc);
	assert_int_equal(a->rows_no_temp, b->rows_no_temp);
	assert_int_equal(a->rows_model, b->rows_model);
	near(a->charge_ah, b->charge_ah);
	near(a->charge_s, b->charge_s);
	assert_true(a->max_charge_a == b->max_charge_a);
	for (k = 0; k < THERMAL_NZONE; k++)
		near(a->zone_ah.zone[k], b->zone_ah.zone[k]);
	near(a->zone_ah.no_temp, b->zone_ah.no_temp);
	near(a->soc_s, b->soc_s);
	near(a->soc_high_s, b->soc_high_s);
	near(a->temp_s, b->temp_s);
	near(a->temp_high_s, b->temp_high_s);
	near(a->model_s, b->model_s);
	near(a->gap_s, b->gap_s);
	assert_int_equal(a->gaps, b->gaps);
	near(a->rf.cycles, b->rf.cycles);
	near(a->rf.range_sum, b->rf.range_sum);
	assert_true(a->rf.max_range == b->rf.max_range);
	assert_int_equal(a->rf.full, b->rf.full);
	assert_int_equal(a->rf.half, b->rf.half);
	near(a->cycles_no_temp, b->cycles_no_temp);
	assert_int_equal(a->topoff_cycles, b->topoff_cycles);
	assert_int_equal(a->topoff_judged, b->topoff_judged);
	assert_int_equal(a->topoff_cut, b->topoff_cut);
	for (k = 0; k < WEAR_NFORM; k++) {
		near(a->cyc[k], b->cyc[k]);
		near(a->cal[k], b->cal[k]);
	}
}

/* Pieces P[0..N) joined as one tree: split at a random place, each side
 * joined on its own, then the two. */
static void
join_tree(struct wear_dev *p, size_t n, const struct wear_conf *c)
{
	size_t m;

	if (n < 2)
		return;
	m = 1 + rnd() % (n - 1);
	join_tree(p, m, c);
	join_tree(p + m, n - m, c);
	wear_join(&p[0], &p[m], c);
}

/*
 * Random devices cut into pieces counted apart, joined in random groupings:
 * the totals of one pass.  Half the runs follow a voltage where the SoC is
 * missing (--full-voltage).
 */
static void
test_wear_join_random(void **st)
{
	static struct sample r[MAXROW];
	struct wear_conf plain, join;
	struct wear_dev one, p[MAXPIECE];
	size_t n, k, cut[MAXPIECE + 1], np, trial, tries = 0;
	unsigned long topoff = 0;

	(void)st;
	for (trial = 0; trial < 400; trial++) {
		wear_conf_default(&plain);
		if (trial % 2)
			plain.topoff.full_v = 4.28;
		plain.hysteresis = (double)(trial % 3);
		join = plain;
		join.joinable = 1;
		n = make_rows(r, MAXROW);
		wear_init(&one, &plain);
		feed(&one, &plain, r, 0, n);
		np = 1 + rnd() % MAXPIECE;
		cut[0] = 0;
		for (k = 1; k < np; k++)
			cut[k] = cut[k - 1] + 1 + rnd() % ((n - cut[k - 1]) /
			    (np - k + 1));
		cut[np] = n;
		for (k = 0; k < np; k++) {
			wear_init(&p[k], &join);
			feed(&p[k], &join, r, cut[k], cut[k + 1]);
		}
		join_tree(p, np, &join);
		wear_finish(&one, &plain);
		wear_finish(&p[0], &join);
		same_acc(&one.acc, &p[0].acc);
		topoff += one.acc.topoff_cycles;
		tries += np > 1;
		wear_free(&one);
		for (k = 0; k < np; k++)
			wear_free(&p[k]);
	}
	/* The histories did exercise the top-off detector and the joins. */
	assert_true(topoff > 100);
	assert_true(tries > 300);
}

/*
 * A hold near full with more than WEAR_PRE_MAX changes of level before the
 * detector settles: the prefix is given up, and a join across it is
 * counted as cut (never silently treated as exact).
 */
static void
test_prefix_lost(void **st)
{
	struct wear_conf c;
	struct wear_dev a, b;
	cw_time t = T0;
	int k;

	(void)st;
	wear_conf_default(&c);
	c.joinable = 1;
	wear_init(&a, &c);
	wear_init(&b, &c);
	for (k = 0; k < 10; k++, t += 60 * S)
		wear_push(&a, &c, t, 4.1, -0.1, 25, 99);
	for (k = 0; k < 2 * WEAR_PRE_MAX + 10; k++, t += 60 * S)
		wear_push(&b, &c, t, 4.1, -0.1, 25, k % 2 ? 98.5 : 98.7);
	assert_int_equal(b.pre_state, WEAR_PRE_LOST);
	assert_int_equal(a.pre_state, WEAR_PRE_OPEN);
	wear_join(&a, &b, &c);
	assert_int_equal(a.acc.topoff_cut, 1);
	assert_int_equal(a.pre_state, WEAR_PRE_LOST);
	wear_free(&a);
	wear_free(&b);
}

/* States written, read back: the same text again, and the same bits. */
struct got {
	struct wear_dev d[16];
	char name[16][16];
	size_t n;
};

static int
on_dev(void *ctx, const char *src, unsigned long line, const char *name,
    size_t len, struct wear_dev *d)
{
	struct got *g = ctx;

	(void)src;
	(void)line;
	assert_true(g->n < 16 && len < 16);
	memcpy(g->name[g->n], name, len + 1);
	g->d[g->n++] = *d;
	return 0;
}

static char *
slurp(const char *path, size_t *n)
{
	FILE *fp = fopen(path, "rb");
	char *s;
	long len;

	assert_non_null(fp);
	fseek(fp, 0, SEEK_END);
	len = ftell(fp);
	rewind(fp);
	s = malloc((size_t)len + 1);
	assert_non_null(s);
	assert_int_equal(fread(s, 1, (size_t)len, fp), (size_t)len);
	fclose(fp);
	*n = (size_t)len;
	return s;
}

static void
spit(const char *path, const char *s, size_t n)
{
	FILE *fp = fopen(path, "wb");

	assert_non_null(fp);
	assert_int_equal(fwrite(s, 1, n, fp), n);
	assert_int_equal(fclose(fp), 0);
}

/* Write devices D[0..N) named DEV0.. to PATH. */
static void
write_file(const char *path, struct wear_dev *d, size_t n,
    const struct wear_conf *c)
{
	FILE *fp = fopen(path, "w");
	char name[16];
	size_t k;

	assert_non_null(fp);
	assert_int_equal(wstate_write_header(fp), 0);
	for (k = 0; k < n; k++) {
		snprintf(name, sizeof(name), k == 1 ? "EB,\"%zu\"" : "EB-%zu",
		    k);
		assert_int_equal(wstate_write_dev(fp, name, strlen(name),
		    &d[k], c), 0);
	}
	assert_int_equal(wstate_write_end(fp, (unsigned long)n), 0);
	assert_int_equal(fclose(fp), 0);
}

static int
read_file(const char *path, struct wear_conf *c, unsigned fixed, int strict,
    struct got *g)
{
	struct wstate_read rd;

	memset(&rd, 0, sizeof(rd));
	rd.conf = c;
	rd.fixed = fixed;
	rd.dev = on_dev;
	rd.ctx = g;
	g->n = 0;
	return wstate_read(&rd, path, strict);
}

static char TMP[64];

static void
tmpname(void)
{
	int fd;

	strcpy(TMP, "/tmp/test_wearstate.XXXXXX");
	fd = mkstemp(TMP);
	assert_true(fd >= 0);
	close(fd);
}

/*
 * Half of a device's rows, written and read back, then the other half:
 * the totals and the report are those of one pass, bit for bit, and the
 * states read back write the same text.
 */
static void
test_round_trip(void **st)
{
	static struct sample r[MAXROW];
	static struct got g;
	struct wear_conf c, c2;
	struct wear_dev one[4], half[4];
	struct wear_result x1, x2;
	size_t n[4], k;
	char *s1, *s2;
	size_t l1, l2;
	int trial;

	(void)st;
	tmpname();
	for (trial = 0; trial < 40; trial++) {
		wear_conf_default(&c);
		c.joinable = trial % 2;
		c.topoff.full_v = trial % 4 < 2 ? CW_MISSING : 4.28;
		for (k = 0; k < 4; k++) {
			n[k] = make_rows(r, 1500);
			wear_init(&one[k], &c);
			feed(&one[k], &c, r, 0, n[k]);
			wear_init(&half[k], &c);
			feed(&half[k], &c, r, 0, n[k] / 2);
			/* Keep the second half of the rows for later. */
			memcpy(&ROWS[k * 1000], &r[n[k] / 2], (n[k] - n[k] /
			    2) * sizeof(r[0]));
		}
		write_file(TMP, half, 4, &c);
		wear_conf_default(&c2);
		assert_int_equal(read_file(TMP, &c2, 0, 1, &g), 0);
		assert_int_equal(g.n, 4);
		assert_true(c2.topoff.full_v == c.topoff.full_v ||
		    (isnan(c2.topoff.full_v) && isnan(c.topoff.full_v)));
		assert_string_equal(g.name[1], "EB,\"1\"");
		s1 = slurp(TMP, &l1);
		write_file(TMP, g.d, 4, &c2);
		s2 = slurp(TMP, &l2);
		assert_int_equal(l1, l2);
		assert_memory_equal(s1, s2, l1);
		free(s1);
		free(s2);
		for (k = 0; k < 4; k++) {
			feed(&g.d[k], &c2, &ROWS[k * 1000], 0, n[k] - n[k] /
			    2);
			wear_finish(&g.d[k], &c2);
			wear_finish(&one[k], &c);
			assert_memory_equal(&g.d[k].acc, &one[k].acc,
			    sizeof(one[k].acc));
			wear_report(&c, &one[k].acc, NULL, 10, &x1);
			wear_report(&c2, &g.d[k].acc, NULL, 10, &x2);
			assert_memory_equal(&x1, &x2, offsetof(struct
			    wear_result, dominant));
			wear_free(&one[k]);
			wear_free(&half[k]);
			wear_free(&g.d[k]);
		}
	}
	unlink(TMP);
}

/* Every way of cutting a state file short is found; so is every altered
 * byte of a row, another version, and settings that do not agree. */
static void
test_damage(void **st)
{
	static struct sample r[MAXROW];
	static struct got g;
	struct wear_conf c, c2;
	struct wear_dev d[3];
	char *s, *t;
	size_t n, len, k;
	int saved, devnull;

	(void)st;
	tmpname();
	wear_conf_default(&c);
	c.joinable = 1;
	for (k = 0; k < 3; k++) {
		n = make_rows(r, 400);
		wear_init(&d[k], &c);
		feed(&d[k], &c, r, 0, n);
	}
	write_file(TMP, d, 3, &c);
	s = slurp(TMP, &len);
	t = malloc(len + 64);
	assert_non_null(t);
	/* Messages are expected here: keep them out of the test log. */
	fflush(stderr);
	saved = dup(2);
	devnull = open("/dev/null", O_WRONLY);
	assert_true(saved >= 0 && devnull >= 0);
	dup2(devnull, 2);

	/* Cut anywhere before the end row's last byte. */
	for (k = 0; k + 1 < len; k++) {
		spit(TMP, s, k);
		wear_conf_default(&c2);
		assert_int_equal(read_file(TMP, &c2, 0, 1, &g), CW_EXIT_DATA);
		while (g.n > 0)
			wear_free(&g.d[--g.n]);
	}
	/* The whole file, and the file without its last newline, read. */
	for (k = len - 1; k <= len; k++) {
		spit(TMP, s, k);
		wear_conf_default(&c2);
		assert_int_equal(read_file(TMP, &c2, 0, 1, &g), 0);
		assert_int_equal(g.n, 3);
		while (g.n > 0)
			wear_free(&g.d[--g.n]);
	}
	/* A digit changed anywhere in a device row is found. */
	for (k = strchr(s, '\n') - s + 1; k < len; k += 7) {
		if (s[k] < '0' || s[k] > '8')
			continue;
		memcpy(t, s, len);
		t[k]++;
		spit(TMP, t, len);
		wear_conf_default(&c2);
		assert_int_equal(read_file(TMP, &c2, 0, 1, &g), CW_EXIT_DATA);
		while (g.n > 0)
			wear_free(&g.d[--g.n]);
	}
	/* Another version, in the rows or in the header. */
	memcpy(t, s, len);
	for (k = 0; k + 15 <= len; k++)
		if (memcmp(t + k, WSTATE_TAG, 15) == 0)
			t[k + 14] = '3';
	spit(TMP, t, len);
	wear_conf_default(&c2);
	assert_int_equal(read_file(TMP, &c2, 0, 1, &g), CW_EXIT_DATA);
	/* A setting given that the state was not made with. */
	spit(TMP, s, len);
	wear_conf_default(&c2);
	c2.hysteresis = 2;
	assert_int_equal(read_file(TMP, &c2, WSTATE_SET_HYSTERESIS, 1, &g),
	    CW_EXIT_DATA);
	while (g.n > 0)
		wear_free(&g.d[--g.n]);
	/* Not given: taken from the state. */
	wear_conf_default(&c2);
	c2.hysteresis = 2;
	assert_int_equal(read_file(TMP, &c2, 0, 1, &g), 0);
	assert_true(c2.hysteresis == 1);
	while (g.n > 0)
		wear_free(&g.d[--g.n]);
	/* A stream (sorted, split by device) needs no end row. */
	spit(TMP, s, (size_t)(strstr(s, "\n,,,") - s) + 1);
	wear_conf_default(&c2);
	assert_int_equal(read_file(TMP, &c2, 0, 0, &g), 0);
	assert_int_equal(g.n, 3);
	while (g.n > 0)
		wear_free(&g.d[--g.n]);
	assert_int_equal(read_file(TMP, &c2, 0, 1, &g), CW_EXIT_DATA);
	while (g.n > 0)
		wear_free(&g.d[--g.n]);

	fflush(stderr);
	dup2(saved, 2);
	close(saved);
	close(devnull);
	for (k = 0; k < 3; k++)
		wear_free(&d[k]);
	free(s);
	free(t);
	unlink(TMP);
}

/*
 * The state format lists the fields of these structs one by one
 * (lib/wearstate.c, devf[]).  Should one of them change, this fails:
 * add the new field to the state (and raise WSTATE_TAG's version if old
 * states can no longer be read), then the size here.  Sizes for x86-64.
 */
static void
test_state_covers(void **st)
{
	(void)st;
	if (sizeof(void *) != 8)
		skip();
	assert_int_equal(sizeof(struct wear_acc), 328);
	assert_int_equal(sizeof(struct rf_state), 136);
	/*
	 * Of struct topoff, standby_a and standby_fall (NaN: the conf's,
	 * which cw-wear never sets per device) and hold.use_dips (cw-wear
	 * reports no holds) are not kept; used and lvl_since are.
	 */
	assert_int_equal(sizeof(struct topoff), 352);
	assert_int_equal(sizeof(struct topoff_hold), 88);
	assert_int_equal(sizeof(struct model_eval), 32);
	assert_int_equal(sizeof(struct wear_run), 48);
	assert_int_equal(sizeof(struct wear_prior), 32);
	assert_int_equal(sizeof(struct wear_dev), 1120);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_rf_join_astm),
		cmocka_unit_test(test_rf_join_random),
		cmocka_unit_test(test_wear_join_random),
		cmocka_unit_test(test_prefix_lost),
		cmocka_unit_test(test_round_trip),
		cmocka_unit_test(test_damage),
		cmocka_unit_test(test_state_covers),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
