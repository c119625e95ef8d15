# sourcecheck: every set-up step lives here, so a fresh clone needs only `make demo` / `make test`.
#
# TORCH_SPEC is the one place torch is chosen. The default takes the CPU build this
# machine keeps on disk; elsewhere, pass the CPU wheel index, e.g.
#   make test TORCH_SPEC="torch==2.13.0 --index-url https://download.pytorch.org/whl/cpu"
PYTHON ?= python3
VENV ?= .venv
TORCH_SPEC ?= torch==2.13.0
BIN := $(VENV)/bin
STAMP := $(VENV)/.installed

.PHONY: install browser demo test lint format bench samples clean

# Debian packages the tests read: WordNet 3.0 (scripts/verifier antonyms, read by nltk).
DEBIAN_PACKAGES := wordnet-base
DEBIAN_STAMP := $(VENV)/.debian

$(DEBIAN_STAMP):
	@if [ ! -d /usr/share/wordnet ]; then \
		if [ "$$(id -u)" = 0 ]; then apt-get update -qq && apt-get install -y -qq $(DEBIAN_PACKAGES); \
		else sudo apt-get update -qq && sudo apt-get install -y -qq $(DEBIAN_PACKAGES); fi; \
	fi
	@mkdir -p $(VENV) && touch $(DEBIAN_STAMP)

$(STAMP): pyproject.toml Makefile
	$(PYTHON) -m venv $(VENV)
	$(BIN)/python -m pip install --quiet --upgrade pip
	$(BIN)/python -m pip install --quiet $(TORCH_SPEC)
	$(BIN)/python -m pip install --quiet -e '.[dev]'
	touch $(STAMP)

install: $(STAMP)

# The HTML report's browser test drives Debian's chromium through Playwright (no browser is
# downloaded). Installed with apt-get only where the binary is missing; CI runs as root.
browser:
	@command -v chromium >/dev/null 2>&1 || { apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y chromium; }

demo: $(STAMP)
	$(BIN)/sourcecheck check sample_manuscript/draft.md --sources sample_sources

test: $(STAMP) $(DEBIAN_STAMP) browser
	$(BIN)/ruff check sourcecheck tests bench scripts
	$(BIN)/mypy
	$(BIN)/python -m pytest -q

lint: $(STAMP)
	$(BIN)/ruff check sourcecheck tests bench scripts
	$(BIN)/ruff format --check sourcecheck tests bench scripts

format: $(STAMP)
	$(BIN)/ruff format sourcecheck tests bench scripts

bench: $(STAMP)
	$(BIN)/python bench/run.py

samples: $(STAMP)
	$(BIN)/python scripts/make_samples.py

clean:
	rm -rf $(VENV) .pytest_cache .ruff_cache bench/out
