#!/usr/bin/env bash
# Runs the production server (scripts/serve.mjs) with its memory bounded. Under load Node lets its
# heap grow far past what it holds alive (about 200 MB here), up to about 800 MB of RSS with fifty
# readers at once; a 448 MB old-space limit makes the collector run sooner instead
# (`npm run bench:load` prints the peak). exec: the caller's signals reach node itself.
exec node --max-old-space-size=448 scripts/serve.mjs "$@"
