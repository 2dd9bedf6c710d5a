#!/bin/sh
# Regenerates the golden files from the current code, for review: the golden tests only compare, and on a
# difference leave their output in golden-actual/ beside the test assembly. This runs them, copies that output over
# the goldens and shows the diff. Read the diff before committing it.
set -e
cd "$(dirname "$0")/.."
dotnet test tests/SettingLint.Reporting.Tests --filter "FullyQualifiedName~golden" -nologo >/dev/null 2>&1 || true
found=0
for actual in tests/SettingLint.Reporting.Tests/bin/*/*/golden-actual/*; do
  [ -f "$actual" ] || continue
  cp "$actual" "tests/SettingLint.Reporting.Tests/golden/$(basename "$actual")"
  rm "$actual"
  found=1
done
if [ "$found" = 0 ]; then echo "update-goldens: every golden matches the current output."; exit 0; fi
git --no-pager diff --stat -- tests/SettingLint.Reporting.Tests/golden
echo "update-goldens: review 'git diff tests/SettingLint.Reporting.Tests/golden' before committing."
