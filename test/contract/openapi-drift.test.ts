/**
 * The committed contract (openapi/openapi.json and openapi/openapi.yaml) must equal what the app
 * generates from its route schemas now, byte for byte, and generating it must give the same
 * bytes every time with nothing of the machine in it.
 */
import { readFileSync } from 'node:fs';
import { hostname, homedir, tmpdir, userInfo } from 'node:os';
import { fileURLToPath } from 'node:url';
import { parse as parseYaml } from 'yaml';
import { beforeAll, describe, expect, it } from 'vitest';
import { diffSummary, generateContract, type ContractFile } from '../../src/bin/export-openapi.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const FIX = 'Run `npm run openapi` and commit openapi/.';

let files: ContractFile[];
beforeAll(async () => {
  files = await generateContract();
});

function committed(name: string): string | null {
  try {
    return readFileSync(`${ROOT}${name}`, 'utf8');
  } catch {
    return null;
  }
}

describe('committed contract', () => {
  it('generates exactly the two files openapi/openapi.json and openapi/openapi.yaml', () => {
    expect(files.map((f) => f.name)).toEqual(['openapi/openapi.json', 'openapi/openapi.yaml']);
  });

  for (const name of ['openapi/openapi.json', 'openapi/openapi.yaml']) {
    it(`${name} equals what the app generates`, () => {
      const f = files.find((x) => x.name === name)!;
      const text = committed(name);
      const same = text === f.text;
      expect(same, same ? '' : `${diffSummary(name, text, f.text)}\n${FIX}`).toBe(true);
    });
  }

  it('the JSON and YAML files describe the same document', () => {
    const json = JSON.parse(files[0]!.text) as unknown;
    const yaml = parseYaml(files[1]!.text) as unknown;
    expect(yaml).toEqual(json);
  });

  it('JSON is written with 2-space indentation and one trailing newline', () => {
    const text = files[0]!.text;
    expect(text.startsWith('{\n  "openapi": "3.1.0",\n')).toBe(true);
    expect(text.endsWith('}\n')).toBe(true);
    expect(text.endsWith('\n\n')).toBe(false);
  });
});

describe('deterministic generation', () => {
  it('a second generation gives the same bytes', async () => {
    const again = await generateContract();
    expect(again.map((f) => f.text)).toEqual(files.map((f) => f.text));
  });

  it('holds nothing of the machine: no paths, host name, user name or local dates', () => {
    const host = hostname();
    const forbidden = [ROOT, ROOT.replace(/\/$/, ''), homedir(), tmpdir(), `/${userInfo().username}/`];
    // A host name long and odd enough not to be an ordinary word of the document.
    if (host.length >= 6 && host !== 'localhost') forbidden.push(host);
    for (const f of files) {
      for (const s of forbidden.filter((x) => x.length > 1)) expect(f.text.includes(s), `${f.name} contains "${s}"`).toBe(false);
      // No time stamps: a date such as 2025-01-31 has no place in a generated contract.
      expect(f.text, `${f.name} contains a date`).not.toMatch(/\b(19|20)\d\d-[01]\d-[0-3]\d\b/);
    }
  });

  it('names the only server as the local default, not the address of this machine', () => {
    const doc = JSON.parse(files[0]!.text) as { servers?: Array<{ url: string }> };
    for (const s of doc.servers ?? []) expect(s.url).toMatch(/^http:\/\/localhost(:\d+)?$/);
  });
});
