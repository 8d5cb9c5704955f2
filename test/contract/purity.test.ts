/**
 * The engine is pure: nothing under src/engine/ imports the web framework, the logger, the
 * schema or validation libraries or any Node built-in, and nothing there reads the process,
 * writes to the console, reads the clock or draws random numbers. Checked on the syntax tree
 * (TypeScript's parser), so words in comments and strings do not count.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const ENGINE = join(ROOT, 'src', 'engine');

const FORBIDDEN_PACKAGES = ['fastify', 'fastify-plugin', 'pino', 'typebox', '@sinclair/typebox', 'ajv', 'ajv-formats'];
const BUILTINS = new Set(builtinModules);

/** Why an import specifier is not allowed in the engine, or null when it is. */
function forbiddenImport(spec: string): string | null {
  if (spec.startsWith('node:')) return 'a Node built-in';
  const bare = spec.split('/')[0]!;
  if (BUILTINS.has(spec) || BUILTINS.has(bare)) return 'a Node built-in';
  if (spec.startsWith('@fastify/')) return 'the web framework';
  for (const p of FORBIDDEN_PACKAGES) if (spec === p || spec.startsWith(`${p}/`)) return `the package ${p}`;
  return null;
}

/** Every impurity in one source text: forbidden imports and uses of process, console, the clock, randomness. */
function impurities(fileName: string, text: string): string[] {
  const sf = ts.createSourceFile(fileName, text, ts.ScriptTarget.ES2023, true, ts.ScriptKind.TS);
  const found: string[] = [];
  const at = (node: ts.Node) => `${fileName}:${sf.getLineAndCharacterOfPosition(node.getStart(sf)).line + 1}`;
  const checkSpec = (node: ts.Node, spec: ts.Expression | undefined) => {
    if (spec && ts.isStringLiteralLike(spec)) {
      const why = forbiddenImport(spec.text);
      if (why) found.push(`${at(node)} imports "${spec.text}" (${why})`);
    }
  };
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node) || ts.isExportDeclaration(node)) checkSpec(node, node.moduleSpecifier);
    else if (ts.isImportEqualsDeclaration(node) && ts.isExternalModuleReference(node.moduleReference)) checkSpec(node, node.moduleReference.expression);
    else if (ts.isCallExpression(node)) {
      const callee = node.expression;
      if (callee.kind === ts.SyntaxKind.ImportKeyword || (ts.isIdentifier(callee) && callee.text === 'require')) checkSpec(node, node.arguments[0]);
    } else if (ts.isImportTypeNode(node) && ts.isLiteralTypeNode(node.argument)) checkSpec(node, node.argument.literal as ts.Expression);

    if (ts.isIdentifier(node) && (node.text === 'process' || node.text === 'console')) {
      const parent = node.parent;
      // `x.process` or `{ process: 1 }` name a property, not the global.
      const isPropertyName =
        (ts.isPropertyAccessExpression(parent) && parent.name === node) ||
        ((ts.isPropertyAssignment(parent) || ts.isPropertySignature(parent) || ts.isPropertyDeclaration(parent) || ts.isMethodDeclaration(parent)) && parent.name === node);
      if (!isPropertyName) found.push(`${at(node)} uses ${node.text}`);
    }
    if (ts.isPropertyAccessExpression(node) && ts.isIdentifier(node.expression)) {
      const pair = `${node.expression.text}.${node.name.text}`;
      if (pair === 'Date.now' || pair === 'Math.random' || pair === 'performance.now') found.push(`${at(node)} uses ${pair}`);
      if (['globalThis', 'global'].includes(node.expression.text) && ['process', 'console'].includes(node.name.text)) found.push(`${at(node)} uses ${pair}`);
    }
    if (ts.isNewExpression(node) && ts.isIdentifier(node.expression) && node.expression.text === 'Date' && (node.arguments?.length ?? 0) === 0) {
      found.push(`${at(node)} reads the clock (new Date())`);
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);
  return found;
}

function tsFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return tsFiles(p);
    return name.endsWith('.ts') ? [p] : [];
  });
}

describe('engine purity', () => {
  const files = tsFiles(ENGINE);

  it('finds the engine sources', () => {
    expect(files.length).toBeGreaterThan(5);
    expect(files.map((f) => relative(ENGINE, f))).toEqual(expect.arrayContaining(['codes.ts', 'fillet.ts', join('provisions', 'fillet.ts')]));
  });

  it('no file under src/engine imports a framework, a logger, a schema library or a Node built-in, or touches process, console, clock or randomness', () => {
    const found = files.flatMap((f) => impurities(relative(ROOT, f), readFileSync(f, 'utf8')));
    expect(found).toEqual([]);
  });
});

describe('the purity check itself can fail', () => {
  const cases: Array<[string, string]> = [
    ["import Fastify from 'fastify';", 'fastify'],
    ["import type { FastifyInstance } from 'fastify';", 'fastify'],
    ["import swagger from '@fastify/swagger';", '@fastify/swagger'],
    ["import pino from 'pino';", 'pino'],
    ["import { Type } from 'typebox';", 'typebox'],
    ["import { Ajv } from 'ajv';", 'ajv'],
    ["import { readFileSync } from 'node:fs';", 'node:fs'],
    ["import { join } from 'path';", 'path'],
    ["export { x } from 'node:os';", 'node:os'],
    ["const m = await import('node:crypto');", 'node:crypto'],
    ["const fs = require('fs');", 'fs'],
    ['export const env = process.env.UNITS;', 'process'],
    ["console.log('x');", 'console'],
    ['const t = Date.now();', 'Date.now'],
    ['const r = Math.random();', 'Math.random'],
    ['const d = new Date();', 'new Date()'],
    ['const p = globalThis.process;', 'process'],
  ];
  for (const [source, what] of cases) {
    it(`flags ${what}`, () => {
      expect(impurities('probe.ts', source).length).toBeGreaterThan(0);
    });
  }

  it('does not flag words in comments, strings or property names', () => {
    const clean = [
      '// the process of welding; console. Date.now Math.random',
      "/** from 'fastify' */ export const s = 'process.env and console.log';",
      'export const o = { process: 1, console: 2 }; export const v = o.process + o.console;',
      "import { te } from './provisions/fillet.js';",
      'export const d = new Date(0).getTime();',
    ].join('\n');
    expect(impurities('probe.ts', clean)).toEqual([]);
  });
});
