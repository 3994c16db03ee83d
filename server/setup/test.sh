#!/usr/bin/env bash
# Moved to test/test.sh; this forwarder is removed once every branch in flight has moved over.
exec bash "$(dirname "$0")/../../test/test.sh" "$@"
