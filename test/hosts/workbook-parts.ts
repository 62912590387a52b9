// A user's workbook written part by part, as Excel lays one out, with what SheetJS cannot keep
// when it rebuilds a file: cell styles, merged cells, an Excel Table, defined names, data
// validation and a comment. Made here from a few strings; no real customer file.
import { deflateRawSync, inflateRawSync } from 'node:zlib';
import { crc32, readZip, writeZip, type ZipEntry } from '../../src/hosts/zip-package.js';

const MAIN = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const REL = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const PKG = 'http://schemas.openxmlformats.org/package/2006/relationships';
const CT = 'application/vnd.openxmlformats-officedocument.spreadsheetml';

export const USER_PARTS: Readonly<Record<string, string>> = {
  '[Content_Types].xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="${CT}.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="${CT}.worksheet+xml"/><Override PartName="/xl/styles.xml" ContentType="${CT}.styles+xml"/><Override PartName="/xl/sharedStrings.xml" ContentType="${CT}.sharedStrings+xml"/><Override PartName="/xl/tables/table1.xml" ContentType="${CT}.table+xml"/><Override PartName="/xl/comments1.xml" ContentType="${CT}.comments+xml"/></Types>`,
  '_rels/.rels': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Relationships xmlns="${PKG}"><Relationship Id="rId1" Type="${REL}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
  'xl/workbook.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<workbook xmlns="${MAIN}" xmlns:r="${REL}"><bookViews><workbookView/></bookViews><sheets><sheet name="Purge" sheetId="1" r:id="rId1"/></sheets><definedNames><definedName name="PurgeTable">Purge!$A$2:$C$5</definedName></definedNames><calcPr calcId="191029"/></workbook>`,
  'xl/_rels/workbook.xml.rels': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Relationships xmlns="${PKG}"><Relationship Id="rId1" Type="${REL}/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="${REL}/styles" Target="styles.xml"/><Relationship Id="rId3" Type="${REL}/sharedStrings" Target="sharedStrings.xml"/></Relationships>`,
  'xl/styles.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<styleSheet xmlns="${MAIN}"><fonts count="2"><font><sz val="11"/><name val="Calibri"/></font><font><b/><sz val="11"/><color rgb="FF0000FF"/><name val="Calibri"/></font></fonts><fills count="3"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill><fill><patternFill patternType="solid"><fgColor rgb="FFFFFF00"/><bgColor indexed="64"/></patternFill></fill></fills><borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders><cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs><cellXfs count="2"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/><xf numFmtId="0" fontId="1" fillId="2" borderId="0" xfId="0" applyFont="1" applyFill="1"/></cellXfs><cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>`,
  'xl/sharedStrings.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<sst xmlns="${MAIN}" count="5" uniqueCount="5"><si><t>Burner purge</t></si><si><t>Air flow OK</t></si><si><t>Fuel valve closed</t></si><si><t>Purge permit</t></si><si><t>input</t></si></sst>`,
  'xl/worksheets/sheet1.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<worksheet xmlns="${MAIN}" xmlns:r="${REL}"><dimension ref="A1:C5"/><sheetData><row r="1"><c r="A1" s="1" t="s"><v>0</v></c></row><row r="2"><c r="A2" t="s"><v>1</v></c><c r="B2" t="s"><v>2</v></c><c r="C2" t="s"><v>3</v></c></row><row r="3"><c r="A3"><v>1</v></c><c r="B3"><v>1</v></c><c r="C3"><v>1</v></c></row><row r="4"><c r="A4"><v>0</v></c><c r="B4"><v>1</v></c><c r="C4"><v>0</v></c></row><row r="5"><c r="A5"><v>1</v></c><c r="B5"><v>0</v></c><c r="C5"><v>0</v></c></row></sheetData><mergeCells count="1"><mergeCell ref="A1:C1"/></mergeCells><dataValidations count="1"><dataValidation type="list" sqref="A3:B5"><formula1>"0,1"</formula1></dataValidation></dataValidations><pageMargins left="0.7" right="0.7" top="0.75" bottom="0.75" header="0.3" footer="0.3"/><tableParts count="1"><tablePart r:id="rId2"/></tableParts></worksheet>`,
  'xl/worksheets/_rels/sheet1.xml.rels': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<Relationships xmlns="${PKG}"><Relationship Id="rId1" Type="${REL}/comments" Target="../comments1.xml"/><Relationship Id="rId2" Type="${REL}/table" Target="../tables/table1.xml"/></Relationships>`,
  'xl/tables/table1.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<table xmlns="${MAIN}" id="1" name="tblPurge" displayName="tblPurge" ref="A2:C5"><autoFilter ref="A2:C5"/><tableColumns count="3"><tableColumn id="1" name="Air flow OK"/><tableColumn id="2" name="Fuel valve closed"/><tableColumn id="3" name="Purge permit"/></tableColumns><tableStyleInfo name="TableStyleMedium2" showRowStripes="1"/></table>`,
  'xl/comments1.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>
<comments xmlns="${MAIN}"><authors><author>Commissioning</author></authors><commentList><comment ref="C3" authorId="0"><text><t>checked at FAT</t></text></comment></commentList></comments>`,
};

/** The parts as a zip, deflated as Excel stores them. */
export function userWorkbook(parts: Readonly<Record<string, string>> = USER_PARTS): Uint8Array {
  const entries: ZipEntry[] = Object.entries(parts).map(([name, xml]) => {
    const raw = new TextEncoder().encode(xml);
    return { name, method: 8, crc: crc32(raw), size: raw.length, data: deflateRawSync(raw), time: 0x6000, date: 0x5a21 };
  });
  return writeZip(entries);
}

/** Every part of a package, inflated: name -> bytes. */
export function partsOf(bytes: Uint8Array): Map<string, Uint8Array> {
  const zip = readZip(bytes);
  if (!zip.ok) throw new Error(zip.error.message);
  return new Map(zip.value.map((e) => [e.name, e.method === 0 ? e.data : new Uint8Array(inflateRawSync(e.data))]));
}

export const nodeInflate = async (data: Uint8Array, maxBytes: number): Promise<Uint8Array> =>
  new Uint8Array(inflateRawSync(data, { maxOutputLength: maxBytes }));
