# Eclipsheet: `make demo` and `make test` do all the set-up on a fresh Debian/Ubuntu.
PY := .venv/bin/python
OXT := dist/eclipsheet.oxt

.PHONY: all setup generate oxt oxt-bundle office25 test test-office25 test-core demo bench speed-tables clean

all: oxt

setup:
	bash tools/setup.sh

# Rewrite the files generated from calcfuncs/registry.py (commit them afterwards).
generate:
	python3 extension/build.py generate

oxt: setup
	$(PY) extension/build.py oxt $(OXT)

# Self-contained: numpy and pyerfa inside (README, "Self-contained builds for other
# platforms"). For this machine's office, or another's, e.g.
#   make oxt-bundle PLATFORM=win_amd64 PYTHON_VERSION=3.11 [CODESIGN=- on a Mac]
oxt-bundle: setup
	$(PY) extension/build.py oxt --bundle $(if $(PLATFORM),--platform $(PLATFORM)) \
	  $(if $(PYTHON_VERSION),--python-version $(PYTHON_VERSION)) $(if $(CODESIGN),--codesign $(CODESIGN))

# The office tests run twice: on the system's LibreOffice 7.4 (the minimum) with the
# rest of the suite, then on 25.2 unpacked beside it into .office25/ by tools/office25.sh,
# in a pytest process whose UNO bridge is 25.2's own.
OFFICE25 := $(CURDIR)/.office25/root/usr/lib/libreoffice/program
OFFICE25_ENV := ECLIPSHEET_OFFICE=$(OFFICE25) \
  PYTHONPATH=$(OFFICE25):$(CURDIR)/.office25/root/usr/lib/python3/dist-packages

office25:
	bash tools/office25.sh >/dev/null

# Where 25.2 cannot be unpacked (not Debian 12), the second run says so and is skipped.
test: oxt
	$(PY) -m pytest -q
	if bash tools/office25.sh >/dev/null; then $(OFFICE25_ENV) $(PY) -m pytest -q -m office; \
	else echo "make test: SKIPPED the office tests on LibreOffice 25.2 (see above)"; fi

# The office tests on LibreOffice 25.2 alone.
test-office25: oxt office25
	$(OFFICE25_ENV) $(PY) -m pytest -q -m office

# The core alone, without the office (fast).
test-core: setup
	$(PY) -m pytest -q -m "not office"

demo: oxt
	$(PY) tools/recompute.py --oxt $(OXT) --out out --messages-expected "Bad input" sample_sheets

# Every benchmark in one run; the figures also go to out/bench-*.json.
bench: oxt
	mkdir -p out
	$(PY) bench/bench_core.py --json out/bench-core.json
	$(PY) bench/bench_libraries.py --json out/bench-libraries.json
	$(PY) bench/bench_constellations.py --json out/bench-constellations.json
	$(PY) bench/bench_longrange.py --json out/bench-longrange.json
	$(PY) bench/bench_night.py --oxt $(OXT) --json out/bench-night.json
	$(PY) bench/bench_recalc.py --oxt $(OXT) --json out/bench-recalc.json
	$(PY) bench/bench_kernels.py --oxt $(OXT) --json out/bench-kernels.json
	$(PY) bench/bench_sheets.py --oxt $(OXT) --json out/bench-sheets.json
	$(PY) bench/bench_engines.py --rows 1000000 --json out/bench-engines.json
	$(PY) tools/speed_table.py --figures out > out/speed-tables.md

# The README's speed tables from the last `make bench`: its figures kept in bench/figures/.
speed-tables:
	mkdir -p bench/figures
	cp out/bench-libraries.json out/bench-sheets.json bench/figures/
	python3 tools/speed_table.py --figures bench/figures --readme README.md

clean:
	rm -rf build dist out .pytest_cache
