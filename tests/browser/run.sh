#!/usr/bin/env bash
# npm run test:browser: the catalogue viewer's page in headless Chromium (Debian's `chromium`, driven by
# playwright-core; nothing downloads a browser). Skips itself in one line where no browser can be had.
set -euo pipefail
cd "$(dirname "$0")/../.."
browser="${LATHER_CHROMIUM:-$(command -v chromium || command -v chromium-browser || true)}"
if [ -z "$browser" ]; then
  echo "browser tests skipped: no chromium on this machine (apt-get install chromium)"
  exit 0
fi
if ! (cd tests/browser && node -e "import('playwright-core').catch(() => process.exit(1))") 2>/dev/null; then
  echo "browser tests skipped: playwright-core is not installed (npm ci installs it)"
  exit 0
fi
export LATHER_CHROMIUM="$browser"
npx tsc --noEmit -p tests/browser/tsconfig.json
npx vitest run --config tests/browser/vitest.config.ts
