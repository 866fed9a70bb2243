// shared: the package's name and version, read from package.json (the one place they are written).

import { readFileSync } from 'node:fs';

interface PackageInfo {
  name: string;
  version: string;
}

let info: PackageInfo | null = null;

/** The package's name and version; package.json sits one folder above both src/ and dist/. */
export function packageInfo(): PackageInfo {
  if (info === null) {
    const text = readFileSync(new URL('../package.json', import.meta.url), 'utf8');
    const { name, version } = JSON.parse(text) as PackageInfo;
    info = { name, version };
  }
  return info;
}
