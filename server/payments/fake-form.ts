// The hosted payment service's request bodies are form-encoded with bracketed keys
// ("line_items[0][price_data][unit_amount]=12340"); this reads them back into nested objects and
// arrays, which is all the local stand-in needs of them.
export type FormValue = string | FormObject | FormValue[];
export interface FormObject {
  [key: string]: FormValue;
}

function keyPath(key: string): string[] {
  const first = /^[^[]+/.exec(key)?.[0] ?? '';
  const rest = [...key.slice(first.length).matchAll(/\[([^\]]*)\]/g)].map((m) => m[1]);
  return [first, ...rest];
}

export function parseForm(body: string): FormObject {
  const root: FormObject = {};
  for (const [key, value] of new URLSearchParams(body)) {
    const path = keyPath(key);
    let node: FormObject | FormValue[] = root;
    path.forEach((part, i) => {
      const last = i === path.length - 1;
      const slot = Array.isArray(node) ? Number(part) : part;
      const container = node as unknown as Record<string | number, FormValue | undefined>;
      if (last) {
        container[slot] = value;
        return;
      }
      const nextIsIndex = /^\d+$/.test(path[i + 1]);
      container[slot] ??= nextIsIndex ? [] : {};
      node = container[slot] as FormObject | FormValue[];
    });
  }
  return root;
}

/** A text field, or undefined when absent or not text. */
export function textAt(form: FormObject, ...path: Array<string | number>): string | undefined {
  let node: FormValue | undefined = form;
  for (const part of path) {
    if (node === undefined || typeof node === 'string') return undefined;
    node = (node as unknown as Record<string | number, FormValue | undefined>)[part];
  }
  return typeof node === 'string' ? node : undefined;
}

/** The flat text map under a key (metadata[…]). */
export function textMap(form: FormObject, key: string): Record<string, string> {
  const node = form[key];
  const out: Record<string, string> = {};
  if (!node || typeof node === 'string' || Array.isArray(node)) return out;
  for (const [k, v] of Object.entries(node)) if (typeof v === 'string') out[k] = v;
  return out;
}
