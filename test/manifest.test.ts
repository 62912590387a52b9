// @vitest-environment happy-dom
// The add-in manifest: valid against Microsoft's published XSDs ([MS-OWEMXML] Appendix A, copies
// in test/data/manifest-schemas/ with SOURCE.md), plus what the schemas do not check.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { validateXML } from 'xmllint-wasm';

const ROOT = join(import.meta.dirname, '..');
const SCHEMA_DIR = join(ROOT, 'test/data/manifest-schemas');
const MANIFEST = readFileSync(join(ROOT, 'manifest.xml'), 'utf8');
const BT = 'http://schemas.microsoft.com/office/officeappbasictypes/1.0';
const ORIGIN = 'https://localhost:3000';

async function schemaErrors(xml: string): Promise<string[]> {
  const schemas = readdirSync(SCHEMA_DIR)
    .filter((f) => f.endsWith('.xsd'))
    .map((fileName) => ({ fileName, contents: readFileSync(join(SCHEMA_DIR, fileName), 'utf8') }));
  const main = schemas.find((s) => s.fileName === 'OfficeAppManifestV1_1.xsd')!;
  const result = await validateXML({
    xml: [{ fileName: 'manifest.xml', contents: xml }],
    schema: [main],
    preload: schemas.filter((s) => s !== main),
  });
  return result.valid ? [] : result.errors.map((e) => e.rawMessage);
}

function elements(xml: string): Element[] {
  const doc = new DOMParser().parseFromString(xml, 'application/xml');
  return [...doc.getElementsByTagName('*')];
}

/** Every URL in the manifest: DefaultValue / Override Value attributes and URL-looking text. */
function urls(xml: string): string[] {
  const out: string[] = [];
  for (const e of elements(xml)) {
    for (const attr of ['DefaultValue', 'Value']) {
      const v = e.getAttribute(attr);
      if (v && /^[a-z]+:\/\//i.test(v)) out.push(v);
    }
    if (e.children.length === 0 && /^[a-z]+:\/\//i.test(e.textContent?.trim() ?? '')) out.push(e.textContent!.trim());
  }
  return out;
}

function urlProblems(xml: string): string[] {
  return urls(xml).flatMap((u) => {
    const url = new URL(u);
    if (url.protocol !== 'https:') return [`${u} is not https`];
    if (url.origin !== ORIGIN) return [`${u} leaves the add-in's own origin ${ORIGIN}`];
    return [];
  });
}

/** Resources by kind: bt:Image, bt:Url, bt:String under ShortStrings or LongStrings. */
function resources(xml: string): Map<string, { kind: string; value: string }> {
  const map = new Map<string, { kind: string; value: string }>();
  for (const e of elements(xml)) {
    if (e.namespaceURI !== BT || !e.hasAttribute('id')) continue;
    const kind = e.localName === 'String' ? e.parentElement!.localName : e.localName;
    map.set(e.getAttribute('id')!, { kind, value: e.getAttribute('DefaultValue') ?? '' });
  }
  return map;
}

/** The kind of resource an element's resid must name (TaskPaneAppVersionOverridesV1_0.xsd types). */
function wantedKind(e: Element): string {
  if (e.localName === 'Image') return 'Image';
  if (['SourceLocation', 'LearnMoreUrl', 'FunctionFile'].includes(e.localName)) return 'Url';
  if (e.localName === 'Description') return 'LongStrings';
  return 'ShortStrings';
}

function residProblems(xml: string): string[] {
  const defined = resources(xml);
  return elements(xml).flatMap((e) => {
    const resid = e.getAttribute('resid');
    if (resid === null) return [];
    const found = defined.get(resid);
    if (!found) return [`${e.localName} resid="${resid}" names no resource`];
    if (found.kind !== wantedKind(e)) return [`${e.localName} resid="${resid}" names a ${found.kind} resource, not ${wantedKind(e)}`];
    return [];
  });
}

/** Width and height from a PNG's IHDR chunk (PNG spec, W3C 2nd edition, 11.2.2). */
function pngSize(bytes: Buffer): { width: number; height: number } {
  const signature = '89504e470d0a1a0a';
  if (bytes.subarray(0, 8).toString('hex') !== signature || bytes.toString('ascii', 12, 16) !== 'IHDR') {
    throw new Error('not a PNG');
  }
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

/** The served file behind an add-in URL: https://localhost:3000/assets/x.png -> assets/x.png. */
function localFile(url: string): string {
  return join(ROOT, new URL(url).pathname.slice(1));
}

function iconProblems(xml: string): string[] {
  const defined = resources(xml);
  const wanted: { url: string; size: number; where: string }[] = [];
  for (const e of elements(xml)) {
    if (e.localName === 'IconUrl') wanted.push({ url: e.getAttribute('DefaultValue')!, size: 32, where: 'IconUrl' });
    if (e.localName === 'HighResolutionIconUrl') wanted.push({ url: e.getAttribute('DefaultValue')!, size: 64, where: 'HighResolutionIconUrl' });
    if (e.namespaceURI === BT && e.localName === 'Image' && e.hasAttribute('resid')) {
      const size = Number(e.getAttribute('size'));
      if (![16, 32, 80].includes(size)) return [`ribbon icon size ${size} is not one of 16, 32, 80`];
      const res = defined.get(e.getAttribute('resid')!);
      if (res) wanted.push({ url: res.value, size, where: `resid ${e.getAttribute('resid')}` });
    }
  }
  const found = wanted.flatMap(({ url, size, where }) => {
    const { width, height } = pngSize(readFileSync(localFile(url)));
    return width === size && height === size ? [] : [`${where}: ${url} is ${width}x${height}, wanted ${size}x${size}`];
  });
  return [...new Set(found)];
}

describe('manifest.xml against the published schemas', () => {
  test('validates against OfficeAppManifestV1_1.xsd with the VersionOverrides schemas', async () => {
    expect(await schemaErrors(MANIFEST)).toEqual([]);
  });

  test('the schema check rejects a manifest without an Id', async () => {
    const broken = MANIFEST.replace(/<Id>[^<]*<\/Id>/, '');
    expect((await schemaErrors(broken)).join('\n')).toMatch(/Version|Id/);
  });

  test('the schema check rejects an unknown Permissions value', async () => {
    const broken = MANIFEST.replace('ReadWriteDocument', 'EverythingPlease');
    expect(await schemaErrors(broken)).not.toEqual([]);
  });
});

describe('manifest.xml: what the schemas leave to us', () => {
  test('asks for Excel (Workbook) and ExcelApi 1.6', () => {
    const sets = elements(MANIFEST).filter((e) => e.localName === 'Set');
    expect(sets.map((s) => [s.getAttribute('Name'), s.getAttribute('MinVersion')])).toEqual([['ExcelApi', '1.6']]);
    expect(MANIFEST).toContain('<Host Name="Workbook"/>');
  });

  test('every URL is https on the add-in origin, and no other domain is declared', () => {
    expect(urls(MANIFEST).length).toBeGreaterThanOrEqual(7);
    expect(urlProblems(MANIFEST)).toEqual([]);
    expect(elements(MANIFEST).some((e) => e.localName === 'AppDomains')).toBe(false);
  });

  test('an http URL is caught', () => {
    const broken = MANIFEST.replace('https://localhost:3000/assets/icon-16.png', 'http://localhost:3000/assets/icon-16.png');
    expect(urlProblems(broken)).toEqual(['http://localhost:3000/assets/icon-16.png is not https']);
  });

  test('every resid names a defined resource of the right kind', () => {
    expect(residProblems(MANIFEST)).toEqual([]);
  });

  test('a resid naming nothing is caught', () => {
    const broken = MANIFEST.replace('<Label resid="IA.Group.Label"/>', '<Label resid="IA.Group.Missing"/>');
    expect(residProblems(broken)).toEqual(['Label resid="IA.Group.Missing" names no resource']);
  });

  test('a resid naming a resource of the wrong kind is caught', () => {
    const broken = MANIFEST.replace('<SourceLocation resid="IA.Taskpane.Url"/>', '<SourceLocation resid="IA.Group.Label"/>');
    expect(residProblems(broken)).toEqual(['SourceLocation resid="IA.Group.Label" names a ShortStrings resource, not Url']);
  });

  test('the ribbon button opens the task pane from the Home tab', () => {
    const tab = elements(MANIFEST).find((e) => e.localName === 'OfficeTab')!;
    expect(tab.getAttribute('id')).toBe('TabHome');
    const action = elements(MANIFEST).find((e) => e.localName === 'Action')!;
    expect(action.getAttribute('xsi:type')).toBe('ShowTaskpane');
  });

  test('icons are PNGs of the size each place asks for (16, 32, 80 on the ribbon; 32 and 64 for the store)', () => {
    expect(iconProblems(MANIFEST)).toEqual([]);
  });

  test('an icon of the wrong size is caught', () => {
    const broken = MANIFEST.replace(
      '<bt:Image id="IA.Icon.80" DefaultValue="https://localhost:3000/assets/icon-80.png"/>',
      '<bt:Image id="IA.Icon.80" DefaultValue="https://localhost:3000/assets/icon-64.png"/>',
    );
    expect(iconProblems(broken)).toEqual(['resid IA.Icon.80: https://localhost:3000/assets/icon-64.png is 64x64, wanted 80x80']);
  });
});
