// A small, forgiving RFC 4180 splitter for the head of a file only, used to compare candidate
// delimiters. It never throws: a quote it cannot make sense of is kept as text, and a quote left open at
// the end of the head closes there. The real rows are read by csv-parse, which is strict.

export interface HeadRecord {
  /** 1-based line on which the record starts. */
  line: number;
  fields: string[];
}

export function splitRecords(text: string, delimiter: string): HeadRecord[] {
  const records: HeadRecord[] = [];
  let fields: string[] = [];
  let field = '';
  let quoted = false;
  let fieldStart = true;
  let line = 1;
  let recordLine = 1;

  const endRecord = (): void => {
    fields.push(field);
    records.push({ line: recordLine, fields });
    fields = [];
    field = '';
    fieldStart = true;
  };

  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"') {
        if (text[i + 1] === '"') {
          field += '"';
          i++;
        } else {
          quoted = false;
        }
      } else {
        if (ch === '\n' || (ch === '\r' && text[i + 1] !== '\n')) line++;
        field += ch;
      }
      continue;
    }
    if (ch === '"' && fieldStart) {
      quoted = true;
      fieldStart = false;
      continue;
    }
    if (ch === delimiter) {
      fields.push(field);
      field = '';
      fieldStart = true;
      continue;
    }
    if (ch === '\r' || ch === '\n') {
      if (ch === '\r' && text[i + 1] === '\n') i++;
      endRecord();
      line++;
      recordLine = line;
      continue;
    }
    field += ch;
    fieldStart = false;
  }
  if (field !== '' || fields.length > 0 || quoted) endRecord();
  return records;
}
