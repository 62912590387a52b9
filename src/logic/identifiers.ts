// Structured Text identifiers for spec-table headers (DESIGN.md section 3).

/** Many controllers cut identifiers at 24 to 31 characters; we stay within the shortest. */
export const MAX_IDENTIFIER_LENGTH = 24;

/**
 * Reserved words of IEC 61131-3:2013 (3rd edition), from memory: the keywords of its Annex C
 * (including the elementary and generic data type names of 6.4 and the SFC and configuration
 * keywords), the standard functions of 6.6.2.5 and the standard function blocks of 6.6.3.5.
 * The families `<type>_TO_<type>`, `TO_<type>`, `TRUNC_<type>` and typed counters and timers
 * are matched by pattern in `isReserved`.
 */
const RESERVED = new Set(
  `
  ABSTRACT ACTION END_ACTION ARRAY AT BY CASE END_CASE CLASS END_CLASS CONFIGURATION
  END_CONFIGURATION CONSTANT CONTINUE DO ELSE ELSIF EN ENO END_FOR END_IF END_REPEAT END_WHILE
  EXIT EXTENDS F_EDGE R_EDGE FINAL FOR FROM FUNCTION END_FUNCTION FUNCTION_BLOCK
  END_FUNCTION_BLOCK IF IMPLEMENTS INITIAL_STEP INTERFACE END_INTERFACE INTERNAL INTERVAL
  METHOD END_METHOD NAMESPACE END_NAMESPACE NON_RETAIN NULL OF ON OVERLAP OVERRIDE PRIORITY
  PRIVATE PROGRAM END_PROGRAM PROPERTY END_PROPERTY PROTECTED PUBLIC READ_ONLY READ_WRITE REF
  REF_TO REPEAT RESOURCE END_RESOURCE RETAIN RETURN SINGLE STEP END_STEP STRUCT END_STRUCT
  SUPER TASK THEN THIS TO TRANSITION END_TRANSITION TYPE END_TYPE UNTIL USING VAR END_VAR
  VAR_ACCESS VAR_CONFIG VAR_EXTERNAL VAR_GLOBAL VAR_INPUT VAR_IN_OUT VAR_OUTPUT VAR_TEMP WHILE
  WITH AND OR XOR NOT MOD TRUE FALSE

  BOOL SINT INT DINT LINT USINT UINT UDINT ULINT REAL LREAL TIME LTIME DATE LDATE TIME_OF_DAY
  LTIME_OF_DAY TOD LTOD DATE_AND_TIME LDATE_AND_TIME DT LDT STRING WSTRING CHAR WCHAR BYTE
  WORD DWORD LWORD BCD ANY ANY_DERIVED ANY_ELEMENTARY ANY_MAGNITUDE ANY_NUM ANY_REAL ANY_INT
  ANY_UNSIGNED ANY_SIGNED ANY_DURATION ANY_BIT ANY_CHARS ANY_STRING ANY_CHAR ANY_DATE

  TRUNC ABS SQRT LN LOG EXP SIN COS TAN ASIN ACOS ATAN ATAN2 ADD MUL SUB DIV EXPT MOVE
  SHL SHR ROL ROR SEL MAX MIN LIMIT MUX GT GE EQ LE LT NE LEN LEFT RIGHT MID CONCAT INSERT
  DELETE REPLACE FIND ADD_TIME ADD_TOD_TIME ADD_DT_TIME SUB_TIME SUB_DATE_DATE SUB_TOD_TIME
  SUB_TOD_TOD SUB_DT_TIME SUB_DT_DT MUL_TIME DIV_TIME CONCAT_DATE_TOD CONCAT_DATE CONCAT_TOD
  CONCAT_DT SPLIT_DATE SPLIT_TOD SPLIT_DT DAY_OF_WEEK TO_BIG_ENDIAN TO_LITTLE_ENDIAN
  FROM_BIG_ENDIAN FROM_LITTLE_ENDIAN IS_VALID IS_VALID_BCD

  SR RS R_TRIG F_TRIG CTU CTD CTUD TP TON TOF
  `
    .trim()
    .split(/\s+/),
);

/** Type names that may stand on either side of a conversion function's `_TO_`. */
const CONVERTIBLE = /^(?:BOOL|S?INT|[DLU]INT|US?INT|U[DL]INT|L?REAL|L?TIME|L?DATE|L?TOD|L?DT|L?TIME_OF_DAY|L?DATE_AND_TIME|W?STRING|W?CHAR|L?WORD|D?WORD|BYTE|BCD)$/;

/** A reserved word of IEC 61131-3, case-insensitively. */
export function isReserved(name: string): boolean {
  const up = name.toUpperCase();
  if (RESERVED.has(up)) return true;
  const conversion = /^(?:(.+)_)?TO_(.+)$/.exec(up);
  if (conversion && (conversion[1] === undefined || CONVERTIBLE.test(conversion[1])) && CONVERTIBLE.test(conversion[2]!)) {
    return true;
  }
  if (/^TRUNC_/.test(up) && CONVERTIBLE.test(up.slice(6))) return true;
  // Typed counters and timers of the 3rd edition: CTU_INT, TON_LTIME, ...
  return /^(?:CTU|CTD|CTUD|TP|TON|TOF)_/.test(up) && CONVERTIBLE.test(up.replace(/^[A-Z]+_/, ''));
}

/** ASCII letters and digits joined by single underscores, starting with a letter. */
const IDENTIFIER = /^[A-Za-z](?:_?[A-Za-z0-9])*$/;

/** A valid, unreserved identifier within the length limit. */
export function isValidIdentifier(name: string): boolean {
  return name.length <= MAX_IDENTIFIER_LENGTH && IDENTIFIER.test(name) && !isReserved(name);
}

/** Letters that do not decompose into a base letter and accents, spelt as German/Nordic writers do. */
const SPELLED: Record<string, string> = {
  ä: 'ae', ö: 'oe', ü: 'ue', Ä: 'Ae', Ö: 'Oe', Ü: 'Ue', ß: 'ss', ẞ: 'SS',
  æ: 'ae', Æ: 'Ae', œ: 'oe', Œ: 'Oe', ø: 'o', Ø: 'O', å: 'aa', Å: 'Aa',
  ł: 'l', Ł: 'L', đ: 'd', Đ: 'D', ð: 'd', Ð: 'D', þ: 'th', Þ: 'Th', ı: 'i',
  '&': ' and ', '%': ' pct ', '#': ' no ', '+': ' plus ',
};

/**
 * Valid IEC 61131-3 identifiers for the headers, one each, in order: ASCII letters, digits
 * and single underscores, starting with a letter, not a reserved word, at most 24 characters,
 * unique case-insensitively. Accents are transliterated (ä -> ae, é -> e, ß -> ss); other
 * characters become word breaks. A leading digit gets the prefix `S_`; a reserved word the
 * suffix `_Sig`; a header with nothing usable becomes `Signal_<position>` (1-based).
 * A long name is cut at a word break; when that cut is another header's name too (or its
 * cut), whole words are left out instead so that a word tells the headers apart
 * (`Light_curtain_active` beside `Light_curtain_muting`); headers alike as names, or ones no
 * choice of words tells apart, get `_2`, `_3`, ... (a name that is unique as derived keeps it).
 */
export function toIdentifiers(headers: readonly string[]): string[] {
  const full = headers.map((h, i) => baseIdentifier(h) || `Signal_${i + 1}`);
  const fits = full.map((f) => f.length <= MAX_IDENTIFIER_LENGTH);
  const prefix = full.map((f, i) => (fits[i] ? f : wordBreakCut(f)));
  // A name that fits as derived is reserved for its header; cut and repeated names come after.
  const taken = new Set(full.filter((_, i) => fits[i]).map((f) => f.toLowerCase()));
  const used = new Set<string>();
  return full.map((name, i) => {
    // A cut that another, different name also cuts to (or is) tells nothing apart: choose words.
    const key = prefix[i]!.toLowerCase();
    const ambiguous = !fits[i] && full.some((other, j) => j !== i && other.toLowerCase() !== name.toLowerCase() && prefix[j]!.toLowerCase() === key);
    // Headers that read alike as names are told apart by number, not by dropping different words.
    const twin = full.some((other, j) => j !== i && other.toLowerCase() === name.toLowerCase());
    const candidates = fits[i] || twin ? [prefix[i]!] : ambiguous ? [...wordChoices(name), prefix[i]!] : [prefix[i]!, ...wordChoices(name)];
    const free = (c: string): boolean => !used.has(c.toLowerCase()) && (fits[i] || !taken.has(c.toLowerCase()));
    let chosen = candidates.find(free);
    for (let k = 2; chosen === undefined; k++) {
      const candidate = withSuffix(prefix[i]!, `_${k}`);
      if (!used.has(candidate.toLowerCase()) && !taken.has(candidate.toLowerCase()) && !isReserved(candidate)) chosen = candidate;
    }
    used.add(chosen.toLowerCase());
    taken.add(chosen.toLowerCase());
    return chosen;
  });
}

/** The identifier a header gets before any cut or suffix for uniqueness (may be too long). */
export function fullIdentifier(header: string): string {
  return baseIdentifier(header);
}

/** Words of a long name beyond which the choices of words to keep are not searched. */
const MAX_WORDS_SEARCHED = 12;

/** A name too long cut at a word break (see withSuffix), not left a reserved word. */
function wordBreakCut(name: string): string {
  const cut = withSuffix(name, '');
  return isReserved(cut) ? withSuffix(cut, '_Sig') : cut;
}

/**
 * Shorter forms of a name too long made of whole words, best first: the first word always
 * kept, then preferring the last word kept, more words, more characters, the earlier words.
 * A number stays with the word before it (`sensor_2` is one word here).
 */
function wordChoices(name: string): string[] {
  const words: string[] = [];
  for (const w of name.split('_')) {
    if (/^[0-9]+$/.test(w) && words.length > 0) words[words.length - 1] += `_${w}`;
    else words.push(w);
  }
  const k = Math.min(words.length, MAX_WORDS_SEARCHED);
  const scored: { text: string; key: number[] }[] = [];
  // Subsets that keep word 0: bit j of `pick` keeps word j + 1.
  for (let pick = 0; pick < 1 << (k - 1); pick++) {
    const kept = [0];
    for (let j = 1; j < k; j++) if (pick & (1 << (j - 1))) kept.push(j);
    const text = kept.map((i) => words[i]!).join('_');
    if (text.length > MAX_IDENTIFIER_LENGTH || isReserved(text)) continue;
    const keepsLast = kept[kept.length - 1] === k - 1 ? 1 : 0;
    scored.push({ text, key: [-keepsLast, -kept.length, -text.length, ...kept] });
  }
  return scored.sort((a, b) => compareKeys(a.key, b.key)).map((c) => c.text);
}

function compareKeys(a: readonly number[], b: readonly number[]): number {
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    const d = (a[i] ?? -1) - (b[i] ?? -1);
    if (d !== 0) return d;
  }
  return 0;
}

/** The header as an identifier, not yet cut to the length limit: spelt in ASCII, prefixed or suffixed as needed. */
function baseIdentifier(header: string): string {
  const spelled = [...header].map((ch) => SPELLED[ch] ?? ch).join('');
  const ascii = spelled.normalize('NFKD').replace(/\p{M}/gu, '');
  let name = ascii.replace(/[^A-Za-z0-9]+/g, '_').replace(/^_+|_+$/g, '');
  if (name === '') return '';
  if (/^[0-9]/.test(name)) name = `S_${name}`;
  if (isReserved(name)) name = withSuffix(name, '_Sig');
  return name;
}

/**
 * `base` cut so that base + suffix fits the length limit, without a trailing underscore.
 * A cut falls on a word break when one leaves at least half the room, so that a reader sees
 * whole words (`Channel_discrepancy`, not `Channel_discrepancy_alar`).
 */
function withSuffix(base: string, suffix: string): string {
  const room = MAX_IDENTIFIER_LENGTH - suffix.length;
  if (base.length <= room) return base + suffix;
  let cut = base.slice(0, room);
  const lastBreak = base[room] === '_' ? room : cut.lastIndexOf('_');
  if (lastBreak >= room / 2) cut = cut.slice(0, lastBreak);
  return cut.replace(/_+$/, '') + suffix;
}
