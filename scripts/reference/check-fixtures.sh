#!/bin/sh
# Re-runs the fixture scripts in scripts/reference/ into a temporary directory and fails when the
# fresh output differs from the committed fixtures in test/reference/:
#   rasch-erm.R        -> erm-*.json
#   mantel-haenszel.R  -> mantel-haenszel-*.json
#   lltm-pcm-erm.R     -> lltm-*.json, pcm-*.json
#   weighted-kappa.R   -> kappa-*.json
#   rasch-lme4.R       -> lme4-*.json
#   normal-cdf.R       -> pnorm.json
#   export-to-erm.R    -> export-erm-*.json (from the committed test/reference/export-erm-*.csv)
# Numbers are compared to 8 significant digits (absolute 1e-9 near zero), lme4's iterative fits to
# 1e-5 relative (see the comment in the comparison); strings and array shapes must match exactly. Needs Rscript with eRm, psychotools, psych, lme4 and jsonlite, and node.
set -eu
cd "$(dirname "$0")/../.."
if ! command -v Rscript >/dev/null 2>&1; then
  echo "check-fixtures: Rscript not found" >&2
  exit 1
fi
fresh=$(mktemp -d)
trap 'rm -rf "$fresh"' EXIT
for script in rasch-erm mantel-haenszel lltm-pcm-erm weighted-kappa rasch-lme4 normal-cdf export-to-erm; do
  Rscript "scripts/reference/$script.R" "$fresh" >"$fresh/$script.log" 2>&1 || {
    cat "$fresh/$script.log" >&2
    exit 1
  }
done
node --input-type=module - "$fresh" <<'JS'
import { readFileSync, readdirSync } from 'node:fs';
const fresh = process.argv[2];
const problems = [];
// glmer's fit is an iterative, derivative-free optimisation: on another CPU (the same lme4, R and
// Debian packages) its floating-point path differs and it stops a few 1e-7 away, and its gradient
// diagnostic moves by about 1e-5. So lme4 fixtures are compared to 1e-5 relative (the tests compare
// our MML with them to 2e-3), and `maxAbsGradient` only to 1e-3 absolute; every closed-form
// fixture keeps 8 significant digits.
let relative = 1e-8;
const compare = (a, b, path) => {
  if (typeof a === 'number' && typeof b === 'number') {
    const scale = Math.max(Math.abs(a), Math.abs(b));
    const allowed = path.endsWith('.maxAbsGradient') && relative > 1e-8 ? 1e-3 : Math.max(1e-9, relative * scale);
    if (Math.abs(a - b) > allowed) problems.push(`${path}: committed ${a}, fresh ${b}`);
  } else if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) problems.push(`${path}: length ${a.length} vs ${b.length}`);
    else a.forEach((v, k) => compare(v, b[k], `${path}[${k}]`));
  } else if (a && b && typeof a === 'object' && typeof b === 'object') {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const key of keys) compare(a[key], b[key], `${path}.${key}`);
  } else if (a !== b) problems.push(`${path}: committed ${JSON.stringify(a)}, fresh ${JSON.stringify(b)}`);
};
const generated = /^(erm|mantel-haenszel|lltm|pcm|kappa|lme4|export-erm)-.*\.json$|^pnorm\.json$/;
const names = readdirSync(fresh).filter((f) => generated.test(f));
if (names.length === 0) problems.push('no fixtures were written');
for (const name of names) {
  let committed;
  try {
    committed = JSON.parse(readFileSync(`test/reference/${name}`, 'utf8'));
  } catch {
    problems.push(`${name}: not committed`);
    continue;
  }
  relative = name.startsWith('lme4-') ? 1e-5 : 1e-8;
  compare(committed, JSON.parse(readFileSync(`${fresh}/${name}`, 'utf8')), name);
}
for (const name of readdirSync('test/reference').filter((f) => generated.test(f))) {
  if (!names.includes(name)) problems.push(`${name}: committed but no longer generated`);
}
if (problems.length > 0) {
  console.error(`check-fixtures: ${problems.length} difference(s)`);
  for (const p of problems.slice(0, 40)) console.error(`  ${p}`);
  process.exit(1);
}
console.log(`check-fixtures: ${names.length} fixtures match`);
JS
