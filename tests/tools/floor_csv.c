/*
 * floor_csv: benchmark floor B.  Inflates every file named and parses
 * every field with libcsv fed in large chunks, the least any CSV tool on
 * these libraries must do.  Prints the record and field counts.
 */
#include <stdio.h>
#include <zlib.h>

#include <csv.h>

static unsigned long long nfield, nrec;

static void
field(void *s, size_t n, void *data)
{
	(void)s;
	(void)n;
	(void)data;
	nfield++;
}

static void
record(int c, void *data)
{
	(void)c;
	(void)data;
	nrec++;
}

int
main(int argc, char *argv[])
{
	static char buf[256 * 1024];
	struct csv_parser p;
	int i, n;

	for (i = 1; i < argc; i++) {
		gzFile gz = gzopen(argv[i], "rb");

		if (gz == NULL || csv_init(&p, CSV_STRICT) != 0) {
			fprintf(stderr, "floor_csv: %s: cannot open\n", argv[i]);
			return 1;
		}
		gzbuffer(gz, sizeof(buf));
		while ((n = gzread(gz, buf, sizeof(buf))) > 0)
			if (csv_parse(&p, buf, (size_t)n, field, record, NULL) !=
			    (size_t)n) {
				fprintf(stderr, "floor_csv: %s: %s\n", argv[i],
				    csv_strerror(csv_error(&p)));
				return 1;
			}
		csv_fini(&p, field, record, NULL);
		csv_free(&p);
		gzclose(gz);
	}
	printf("%llu records, %llu fields\n", nrec, nfield);
	return 0;
}
