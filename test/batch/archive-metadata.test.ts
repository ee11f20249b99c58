/**
 * The metafile and the EML method step, fixture by fixture: input and expected output side by side.
 * Rules from the Darwin Core text guide (Darwin Core Maintenance Group 2023, TDWG,
 * http://rs.tdwg.org/dwc/terms/guides/text/, "guide §") and the EML 2.2.0 schema (eml-dataset,
 * eml-methods: the order of a dataset's and a methods element's children).
 */
import { describe, expect, it } from 'vitest';
import { parseMetaXml } from '../../src/batch/archive/meta-xml.ts';
import { formatMetaXml } from '../../src/output/darwin-core-archive.ts';
import { withMethodStep } from '../../src/output/eml-method-step.ts';
import { columnNames } from '../../src/batch/archive/core-table.ts';

const DWC = 'http://rs.tdwg.org/dwc/terms/';

describe('parseMetaXml', () => {
  it('applies the defaults of guide §2.2 when the attributes are left out', () => {
    const meta = parseMetaXml(`<archive xmlns="http://rs.tdwg.org/dwc/text/"><core rowType="${DWC}Occurrence"><files><location>occ.csv</location></files><field index="0" term="${DWC}locality"/></core></archive>`);
    expect(meta.core).toMatchObject({ fieldsTerminatedBy: ',', linesTerminatedBy: '\n', fieldsEnclosedBy: '"', encoding: 'UTF-8', ignoreHeaderLines: 0, locations: ['occ.csv'] });
    expect(meta.metadata).toBeUndefined();
  });

  it('reads escapes as characters, <id> and <coreid> (either case), and a field with a default and no index (guide §2.2, §2.4)', () => {
    const meta = parseMetaXml(`<?xml version="1.0"?>
<archive xmlns="http://rs.tdwg.org/dwc/text/" metadata="eml.xml">
  <core encoding="windows-1252" fieldsTerminatedBy="\\t" linesTerminatedBy="\\r\\n" fieldsEnclosedBy="" ignoreHeaderLines="1" rowType="${DWC}Occurrence">
    <files><location>occurrence.txt</location></files>
    <id index="0"/>
    <field index="3" term="${DWC}locality" default="unknown"/>
    <field term="${DWC}countryCode" default="QV"/>
  </core>
  <extension rowType="http://rs.tdwg.org/ac/terms/Multimedia"><files><location>m.txt</location></files><coreId index="0"/><field index="1" term="http://purl.org/dc/terms/identifier"/></extension>
</archive>`);
    expect(meta.metadata).toBe('eml.xml');
    expect(meta.core).toMatchObject({ encoding: 'windows-1252', fieldsTerminatedBy: '\t', linesTerminatedBy: '\r\n', fieldsEnclosedBy: '', ignoreHeaderLines: 1, idIndex: 0 });
    expect(meta.core.fields).toEqual([{ index: 3, term: `${DWC}locality`, default: 'unknown' }, { term: `${DWC}countryCode`, default: 'QV' }]);
    expect(meta.extensions[0].idIndex).toBe(0);
  });

  it('refuses a metafile without a core, a core without rowType, and XML that is not well-formed, saying which', () => {
    expect(() => parseMetaXml('<archive xmlns="http://rs.tdwg.org/dwc/text/"></archive>')).toThrow(/no <core> element/);
    expect(() => parseMetaXml('<archive><core><files><location>a</location></files></core></archive>')).toThrow(/no rowType/);
    expect(() => parseMetaXml('<archive><core rowType="x">')).toThrow(/not well-formed/);
  });

  it('writes a metafile that reads back the same (round trip)', () => {
    const meta = parseMetaXml(`<archive xmlns="http://rs.tdwg.org/dwc/text/" metadata="eml.xml"><core encoding="UTF-8" fieldsTerminatedBy="\\t" linesTerminatedBy="\\r\\n" fieldsEnclosedBy='"' ignoreHeaderLines="1" rowType="${DWC}Occurrence"><files><location>a &amp; b.txt</location></files><id index="0"/><field index="0" term="${DWC}occurrenceID"/><field index="1" term="${DWC}countryCode" default="Q&quot;V"/></core></archive>`);
    expect(parseMetaXml(formatMetaXml(meta))).toEqual(meta);
  });
});

describe('columnNames', () => {
  it('names columns by their terms; an undescribed column by its header-line name unless the batch would read that name as a term (guide §2.4: meta.xml says what a column holds)', () => {
    const core = parseMetaXml(`<archive xmlns="http://rs.tdwg.org/dwc/text/"><core rowType="${DWC}Occurrence"><files><location>o.txt</location></files><id index="0"/><field index="1" term="${DWC}locality"/><field index="2" term="http://example.org/terms/locality"/></core></archive>`).core;
    expect(columnNames(core, 6, ['ID', 'where', 'other', 'note', 'decimalLatitude', ''])).toEqual(['id', 'locality', 'http://example.org/terms/locality', 'note', 'column4', 'column5']);
  });
});

describe('withMethodStep', () => {
  const step = ['Georeferenced by whereabouts (test) & checked'];
  const added = '<methodStep><description><para>Georeferenced by whereabouts (test) &amp; checked</para></description></methodStep>';
  const cases: [string, string, string][] = [
    ['a dataset without methods: a methods element before <project>',
      '<eml:eml xmlns:eml="e"><dataset><title>T</title><contact/><project/></dataset></eml:eml>',
      `<eml:eml xmlns:eml="e"><dataset><title>T</title><contact/><methods>${added}</methods><project/></dataset></eml:eml>`],
    ['a dataset without methods or later children: a methods element at its end',
      '<eml:eml xmlns:eml="e"><dataset><title>T</title></dataset><additionalMetadata/></eml:eml>',
      `<eml:eml xmlns:eml="e"><dataset><title>T</title><methods>${added}</methods></dataset><additionalMetadata/></eml:eml>`],
    ['methods with steps and sampling: the step after the last step, before <sampling>',
      '<eml:eml xmlns:eml="e"><dataset><methods><methodStep/><sampling/></methods></dataset></eml:eml>',
      `<eml:eml xmlns:eml="e"><dataset><methods><methodStep/>${added}<sampling/></methods></dataset></eml:eml>`],
    ['an empty <methods/>: replaced by one holding the step',
      '<eml:eml xmlns:eml="e"><dataset><methods/></dataset></eml:eml>',
      `<eml:eml xmlns:eml="e"><dataset><methods>${added}</methods></dataset></eml:eml>`],
  ];
  for (const [name, input, expected] of cases) {
    it(name, () => expect(withMethodStep(Buffer.from(input), step).toString('utf8')).toBe(expected));
  }

  it('keeps a byte order mark and an ISO-8859-1 document byte for byte around the step', () => {
    const latin1 = Buffer.from('<?xml version="1.0" encoding="ISO-8859-1"?><eml><dataset><title>Río</title></dataset></eml>', 'latin1');
    const out = withMethodStep(latin1, ['año']);
    expect(out.toString('latin1')).toBe('<?xml version="1.0" encoding="ISO-8859-1"?><eml><dataset><title>Río</title><methods><methodStep><description><para>año</para></description></methodStep></methods></dataset></eml>');
    const bom = Buffer.from([0xef, 0xbb, 0xbf]);
    const withBom = withMethodStep(Buffer.concat([bom, Buffer.from('<eml><dataset></dataset></eml>')]), ['x']);
    expect(withBom.subarray(0, 3)).toEqual(bom);
    expect(withBom.subarray(3).toString('utf8')).toBe('<eml><dataset><methods><methodStep><description><para>x</para></description></methodStep></methods></dataset></eml>');
  });
});
