import type { MappingFieldName } from '../../shared/api/suppliers';
// Header words per field, as they look after normalizeHeader() (lower case, accents and punctuation
// removed, "ß" → "ss", "ø" → "dia"): English plus a few common European header words. A header equal
// to a phrase is a strong match; a header containing one as whole words is a weaker one.

// prettier-ignore
export const PHRASES: Record<MappingFieldName, string[]> = {
  sku: ['sku', 'supplier sku', 'part no', 'part number', 'part', 'part nr', 'item', 'item no',
    'item number', 'item code', 'article', 'article no', 'art nr', 'art no', 'artikel',
    'artikelnummer', 'artikel nr', 'ref', 'reference', 'code', 'product code', 'catalog no',
    'cat no', 'order no', 'order code', 'bestellnummer', 'bestell nr', 'codice', 'codigo',
    'referencia', 'no article', 'n article'],
  description: ['description', 'desc', 'name', 'product', 'product name', 'item description',
    'bezeichnung', 'beschreibung', 'artikelbezeichnung', 'designation', 'libelle', 'descrizione',
    'descripcion', 'text', 'title'],
  size: ['size', 'bore', 'bore size', 'diameter', 'dia', 'piston size', 'piston diameter',
    'piston dia', 'nominal size', 'durchmesser', 'bohrung', 'kolben dia', 'mass', 'kolbenmass',
    'diametre', 'alesage', 'diametro', 'cylinder bore', 'bore dia'],
  oversize: ['oversize', 'over size', 'o s', 'os', 'step', 'ubermass', 'ubergrosse', 'stufe',
    'surcote', 'cote', 'maggiorazione', 'sobremedida', 'repair step'],
  price: ['price', 'unit price', 'net price', 'list price', 'cost', 'unit cost', 'preis',
    'ek preis', 'nettopreis', 'einzelpreis', 'stuckpreis', 'prix', 'prix net', 'prix unitaire',
    'prezzo', 'precio', 'net'],
  available: ['available', 'avail', 'qty', 'qty available', 'quantity', 'stock', 'on hand',
    'in stock', 'bestand', 'lagerbestand', 'verfugbar', 'menge', 'lager', 'dispo', 'disponible',
    'quantite', 'disponibilita', 'existencias'],
  leadDays: ['lead time', 'lead days', 'leadtime', 'lead', 'delivery days', 'delivery time',
    'lieferzeit', 'delai', 'delai livraison', 'tempi di consegna', 'plazo', 'days'],
  gtin: ['gtin', 'ean', 'upc', 'barcode', 'ean13', 'ean 13', 'ean code', 'gtin 13', 'gtin13',
    'upc a'],
  currency: ['currency', 'curr', 'ccy', 'cur', 'wahrung', 'devise', 'valuta', 'moneda', 'divisa'],
};

/** Header words that rule a column out for a field ("min qty" is not the quantity available). */
export const EXCLUDE: Partial<Record<MappingFieldName, string[]>> = {
  available: ['min', 'minimum', 'moq', 'pack', 'order'],
  price: ['old', 'previous', 'alt', 'uvp', 'rrp', 'msrp'],
  description: ['size', 'price'],
};
