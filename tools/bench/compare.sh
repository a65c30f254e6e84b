#!/bin/sh
# Builds the jar if it is missing, then prints the side-by-side benchmark table.
# Usage (from the repository root): tools/bench/compare.sh [compare_path.py options]
set -eu
cd "$(dirname "$0")/../.."
if [ ! -f processor/target/lariat.jar ]; then
  mvn -B -q package -DskipTests -pl processor
fi
exec /usr/bin/python3 tools/bench/compare_path.py --jar processor/target/lariat.jar "$@"
