// Collects the Material Symbols ligature names the client uses, from its templates and TypeScript.
// Used by tools/subset-icons.sh (to build the subset font) and by src/icons.spec.ts (to check the
// committed subset still holds every icon the app names). Conventions it relies on:
//   <mat-icon>name</mat-icon>, string literals inside a mat-icon's {{ }}, fontIcon="name",
//   `icon: 'name'` fields, and every value of a `*_ICONS` table (plus literals on lines naming ICONS).
'use strict';
const fs = require('node:fs');
const path = require('node:path');

const NAME = /^[a-z][a-z0-9_]*$/;

function filesUnder(dir) {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return filesUnder(full);
    return /\.(html|ts)$/.test(entry.name) && !entry.name.endsWith('.spec.ts') ? [full] : [];
  });
}

function literals(text) {
  return [...text.matchAll(/'([^'\n]*)'|"([^"\n]*)"/g)].map((m) => m[1] ?? m[2]);
}

/** Icon names used in one template or TypeScript source. */
function iconNamesIn(source) {
  const names = new Set();
  const add = (name) => {
    const trimmed = name.trim();
    if (NAME.test(trimmed)) names.add(trimmed);
  };
  for (const m of source.matchAll(/<mat-icon\b[^>]*>([\s\S]*?)<\/mat-icon>/g)) {
    const body = m[1];
    const bindings = [...body.matchAll(/\{\{([\s\S]*?)\}\}/g)];
    if (bindings.length === 0) add(body);
    // A literal compared with (=== 'closes') is data, not an icon.
    for (const b of bindings) literals(b[1].replace(/[!=]==?\s*('[^']*'|"[^"]*")/g, '')).forEach(add);
  }
  for (const m of source.matchAll(/fontIcon\s*=\s*"'?([a-z0-9_]+)'?"/g)) add(m[1]);
  for (const m of source.matchAll(/\bicon\s*:\s*['"]([a-z0-9_]+)['"]/g)) add(m[1]);
  for (const m of source.matchAll(/\b[A-Z_]*ICONS\b[^=\n]*=\s*\{([\s\S]*?)\};/g)) {
    for (const line of m[1].split('\n')) {
      const value = line.split(':').slice(1).join(':');
      literals(value).forEach(add);
    }
  }
  for (const line of source.split('\n')) {
    if (/\b[A-Z_]*ICONS\[/.test(line) && !/^\s*(\/\/|\*)/.test(line)) literals(line).forEach(add);
  }
  return names;
}

/** Every icon name the app under `root` (default src/app) uses, sorted. */
function collectIconNames(root = path.join(__dirname, '..', 'src', 'app')) {
  const all = new Set();
  for (const file of filesUnder(root)) iconNamesIn(fs.readFileSync(file, 'utf8')).forEach((n) => all.add(n));
  return [...all].sort();
}

module.exports = { collectIconNames, iconNamesIn };

if (require.main === module) process.stdout.write(collectIconNames().join('\n') + '\n');
