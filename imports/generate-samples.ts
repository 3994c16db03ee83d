// Writes the four sample price lists in this folder. Run again with `npx tsx imports/generate-samples.ts`
// after changing it; the output is the same on every run. Every supplier, SKU and price is invented; the
// GTINs use the GS1 prefixes 20–22 (restricted circulation, never on a real product) with valid check
// digits except where a broken row needs a wrong one.
import { writeFileSync } from 'node:fs';
import iconv from 'iconv-lite';
import { gtinCheckDigit } from '../shared/gtin';

const out = __dirname;
const gtin = (body: string): string => body + gtinCheckDigit(body);
let serial = 1;
const code = (prefix: string, len: number): string =>
  gtin(prefix + String(serial++).padStart(len - 1 - prefix.length, '0'));

// The sizes follow the invented demo families of seeds/demo/catalog.ts: 2.1875, 2.9375 and 3.3750 in
// (0.010 in steps, the last one on to +0.060 in); 54.00, 72.00 and 77.00 mm (0.25 mm steps); 66.40 mm
// (0.50 mm steps). Tessaway also lists a 56.00 mm family the demo shop does not keep, so the mapping
// queue has items no catalog part matches.

// (a) Quillmark Piston Supply: comma, UTF-8, inches, LF line ends, quoted fields holding commas and
// doubled quotes (2.1875"" bore), a price with a thousands separator.
{
  const imperial = ['STD', '+.010', '+.020', '+.030', '+.040'];
  const fams = [
    ['2187', 2.1875, '44.60', '19.90', imperial],
    ['2937', 2.9375, '52.30', '23.10', imperial],
    ['3375', 3.375, '71.80', '31.40', [...imperial, '+.060']],
  ] as const;
  const lines = [
    'Part Number,Description,Bore (in),Oversize,Price,Qty Available,Lead Time (days),UPC',
  ];
  const qty = [4, 9, 2, 0, 1, 6, 3, 1, 0, 2];
  let q = 0;
  for (const [tag, std, piston, rings, steps] of fams) {
    for (const label of steps) {
      const off = label === 'STD' ? 0 : Number(label.replace('+', '0'));
      const bore = (std + off).toFixed(4);
      const s = label === 'STD' ? 'STD' : label.slice(2);
      lines.push(
        `QP-${tag}-${s},"Piston, cast, ${bore}"" bore, pin and clips",${bore},${label},${piston},${qty[q++ % qty.length]},14,${code('2', 12)}`,
      );
      lines.push(
        `QR-${tag}-${s},"Ring set ${bore}"" (one cylinder)",${bore},${label},${rings},${qty[q++ % qty.length] + 3},14,${code('2', 12)}`,
      );
    }
  }
  lines.push(
    `QK-3375-SET4,"Piston set of 4, 3.3950"" bore, matched weights",3.3950,+.020,"1,089.00",1,30,${code('2', 12)}`,
  );
  writeFileSync(`${out}/quillmark-pistons-2026-12.csv`, lines.join('\n') + '\n');
}

// (b) Morvendt Motorteile: semicolon, decimal comma, Windows-1252 bytes (Ø Ü ß µ ° é, € = 0x80,
// – = 0x96), millimetres, CRLF line ends, "1.234,50".
{
  const steps = ['0,00', '0,25', '0,50', '0,75', '1,00'];
  const fams = [
    ['54', 54, '48,90', '19,80'],
    ['72', 72, '71,30', '26,10'],
    ['77', 77, '83,40', '29,50'],
  ] as const;
  const lines = ['Art.-Nr.;Bezeichnung;Ø mm;Übermaß;Preis €;Bestand;Lieferzeit;EAN'];
  let n = 0;
  for (const [tag, std, piston, rings] of fams) {
    for (const st of steps) {
      const off = Number(st.replace(',', '.'));
      const size = (std + off).toFixed(2).replace('.', ',');
      const stepTag = st.replace(',', '');
      const label = off === 0 ? 'Standard' : `Übermaß ${st}`;
      const desc = [
        `Kolben Ø ${size} mm – ${label}, Rautiefe Rz 2 µm`,
        `Kolben ø ${size} mm – ${label}, Ringstöße 120° versetzt`,
        `"Kolben Ø ${size} mm; qualité renforcée – ${label}"`,
      ][n % 3];
      lines.push(
        `MV-K${tag}-${stepTag};${desc};${size};${st};${piston};${(n * 7) % 11};${5 + (n % 3) * 5} Tage;${code('20', 13)}`,
      );
      lines.push(
        `MV-R${tag}-${stepTag};Kolbenringsatz ø ${size} mm – 2 Ringe, Stoßspiel geprüft;${size};${st};${rings};${(n * 5) % 9};5 Tage;${code('20', 13)}`,
      );
      n++;
    }
  }
  lines.push(
    `MV-Z72-SET;"Zylinder-Satz 2× Kolben Ø 72,50 mm, Pfand 5 € je Kolben";72,50;0,50;1.234,50;1;3 Wochen;${code('20', 13)}`,
  );
  writeFileSync(
    `${out}/morvendt-motorteile-2026-12.csv`,
    iconv.encode(lines.join('\r\n') + '\r\n', 'win1252'),
  );
}

// (c) Tessaway Engine Spares: tab-separated, UTF-8 with a BOM, two title lines above the header, sizes
// written with their unit ("66.90 mm"), prices with a pound sign, lead times in days or weeks.
{
  const fams = [
    ['6640', 66.4, '58.10', ['STD', '+0.50', '+1.00', '+1.50']],
    ['72', 72, '47.85', ['STD', '+0.25', '+0.50', '+0.75', '+1.00']],
    ['56', 56, '36.40', ['STD', '+0.25', '+0.50', '+0.75', '+1.00']],
  ] as const;
  const lines = [
    'Tessaway Engine Spares – trade price list',
    'Valid from 1 December 2026 · prices in GBP, carriage extra',
    [
      'SKU',
      'Item description',
      'Piston size',
      'Step',
      'Unit price',
      'In stock',
      'Lead time',
      'EAN-13',
    ].join('\t'),
  ];
  let n = 0;
  for (const [tag, std, price, steps] of fams) {
    for (const st of steps) {
      const off = st === 'STD' ? 0 : Number(st);
      const size = (std + off).toFixed(2);
      const s = st === 'STD' ? 'STD' : st.replace('+', '').replace('.', '');
      lines.push(
        [
          `TW-${tag}-${s}`,
          `Piston ${size} mm (${st}), forged, with pin and clips`,
          `${size} mm`,
          st,
          `£${price}`,
          String((n * 3) % 5),
          n % 2 ? '2 wk' : '10 days',
          code('21', 13),
        ].join('\t'),
      );
      n++;
    }
  }
  writeFileSync(`${out}/tessaway-spares-2026-12.txt`, '\ufeff' + lines.join('\n') + '\n');
}

// (d) Orrinpike Old Stock: comma, UTF-8, millimetres, and a handful of broken rows: a negative price,
// a row short of a column, a wrong GTIN check digit, an unknown currency, a size in centimetres, a
// SKU given twice and a price that is a word.
{
  const lines = ['sku,description,size_mm,oversize_mm,price,currency,available,gtin'];
  const ok = (sku: string, d: string, size: string, os: string, price: string, avail: string) =>
    lines.push(`${sku},${d},${size},${os},${price},EUR,${avail},${code('22', 13)}`);
  ok('OP-54-050', 'Piston 54.50 new old stock (boxed)', '54.50', '0.50', '38.00', '1');
  ok('OP-54-075', 'Piston 54.75 new old stock (boxed)', '54.75', '0.75', '38.00', '2');
  ok('OP-72-025', 'Piston 72.25 new old stock', '72.25', '0.25', '41.50', '1');
  ok('OP-72-100', 'Piston 72.00 +1.00 last one', '73.00', '1.00', '45.00', '1');
  lines.push(`OP-6640-050,Piston 66.90 shelf-worn box,66.90,0.50,-12.00,EUR,1,${code('22', 13)}`);
  lines.push(`OP-6640-100,Piston 67.40 with rings,67.40,1.00,39.00,EUR,1`);
  lines.push(`OP-6640-150,Piston 67.90 with rings,67.90,1.50,44.00,EUR,2,2200000000018`);
  ok('OP-54-025', 'Piston 54.25 forged', '54.25', '0.25', '52.00', '1');
  lines.push(`OP-72-050,Piston 72.50 forged,72.50,0.50,52.00,EUX,1,${code('22', 13)}`);
  lines.push(`OP-72-075,Piston 72.75 forged,72.75 cm,0.75,52.00,EUR,1,${code('22', 13)}`);
  ok('OP-54-100', 'Piston 55.00 forged', '55.00', '1.00', '55.00', '1');
  lines.push(`OP-54-050,Piston 54.50 second box,54.50,0.50,36.00,EUR,1,${code('22', 13)}`);
  lines.push(`OP-54-000,Piston 54.00 price on request,54.00,0,call,EUR,1,${code('22', 13)}`);
  ok('OP-6640-000', 'Piston 66.40 new old stock', '66.40', '0', '41.50', '3');
  writeFileSync(`${out}/orrinpike-old-stock-2026-11.csv`, lines.join('\n') + '\n');
}
