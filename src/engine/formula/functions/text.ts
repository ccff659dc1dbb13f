/**
 * Text and date functions. Conversions whose result depends on the computer's locale (TEXT's
 * format codes, VALUE of "1,234" or "01/02/2025", DATEVALUE of anything but an ISO date) are
 * refused with a message rather than guessed.
 */
import { Ctx, notComputed, toArray } from "../evaluate";
import { numberFromText, toNumber, toText } from "../coerce";
import { Scalar, Value, XlArray, XlError, XlRef, err, isError } from "../values";
import { Table, bool, classes, eachValue, int, num, scalarFn, text } from "./kit";

function textFn(min: number, max: number, f: (s: string, a: (Scalar | undefined)[]) => Scalar) {
  return scalarFn(min, max, (a) => {
    const s = text(a[0]);
    if (isError(s)) return s;
    return f(s, a);
  });
}

function concatAll(args: readonly (Value | undefined)[], ctx: Ctx, sep?: string, skipEmpty = false): Scalar {
  const parts: string[] = [];
  const e = eachValue(args, ctx, (v) => {
    if (isError(v)) return v;
    const s = toText(v) as string;
    if (skipEmpty && s === "") return;
    parts.push(s);
  });
  if (e) return e;
  const out = parts.join(sep ?? "");
  return out.length > 32767 ? err("#VALUE!", "text longer than 32,767 characters") : out;
}

/** An ISO 8601 date (2025-01-02), which every locale reads the same, as a serial number. */
function isoDateSerial(s: string, date1904: boolean): number | undefined {
  const m = /^\s*(\d{4})-(\d{1,2})-(\d{1,2})\s*$/.exec(s);
  if (!m) return undefined;
  const v = dateSerial(Number(m[1]), Number(m[2]), Number(m[3]), date1904);
  return isError(v) ? undefined : v;
}

// ---------------------------------------------------------------------------------------------
// Dates: serial numbers in the 1900 system (with Excel's 29 February 1900) or the 1904 system.

const DAY_MS = 86400000;

/** Serial number of a date (month and day may overflow, as DATE allows). */
export function dateSerial(y: number, m: number, d: number, date1904: boolean): number | XlError {
  let year = Math.trunc(y);
  if (year < 0 || year > 9999) return err("#NUM!", `year ${y} is outside 0 to 9999`);
  if (year < 1900) year += 1900;
  const ms = Date.UTC(year, Math.trunc(m) - 1, 1) + (Math.trunc(d) - 1) * DAY_MS;
  if (date1904) {
    const s = (ms - Date.UTC(1904, 0, 1)) / DAY_MS;
    return s < 0 ? err("#NUM!", "the date is before 1904, the start of this workbook's date system") : s;
  }
  let s = (ms - Date.UTC(1899, 11, 31)) / DAY_MS;
  // Excel's 1900 system counts 29 February 1900, a day that did not exist.
  if (s >= 60) s += 1;
  return s < 0 ? err("#NUM!", "the date is before 1900, the start of this workbook's date system") : s;
}

/** The calendar date of a serial number; Excel's serial 60 in the 1900 system is 29 February 1900. */
export function serialDate(serial: number, date1904: boolean): { y: number; m: number; d: number } | XlError {
  if (serial < 0) return err("#NUM!", "a negative date");
  const whole = Math.floor(serial);
  if (!date1904) {
    if (whole === 60) return { y: 1900, m: 2, d: 29 };
    if (whole === 0) return { y: 1900, m: 1, d: 0 };
    const ms = Date.UTC(1899, 11, 31) + (whole < 60 ? whole : whole - 1) * DAY_MS;
    const dt = new Date(ms);
    return { y: dt.getUTCFullYear(), m: dt.getUTCMonth() + 1, d: dt.getUTCDate() };
  }
  const dt = new Date(Date.UTC(1904, 0, 1) + whole * DAY_MS);
  return { y: dt.getUTCFullYear(), m: dt.getUTCMonth() + 1, d: dt.getUTCDate() };
}

function datePart(part: "y" | "m" | "d") {
  return {
    min: 1,
    max: 1,
    call: ([v]: readonly (Value | undefined)[], ctx: Ctx): Scalar => {
      const x = v as Scalar;
      if (typeof x === "string") {
        const n = numberFromText(x);
        if (n === undefined) return notComputed(`reading the date in text "${x}" depends on the computer's locale; not computed headless`);
        return datePartOf(n, part, ctx);
      }
      const n = num(x);
      if (isError(n)) return n;
      return datePartOf(n, part, ctx);
    },
  };
}

function datePartOf(n: number, part: "y" | "m" | "d", ctx: Ctx): Scalar {
  const d = serialDate(n, ctx.host.date1904);
  if (isError(d)) return d;
  return d[part];
}

/** A count between -1 and 0: truncated it is 0, yet it is negative; which Excel does first is not checked. */
function fractionalNegative(name: string, v: Scalar | undefined): void {
  const n = v === undefined ? 0 : toNumber(v);
  if (typeof n === "number" && n < 0 && n > -1) notComputed(`${name} with a count between -1 and 0 is not computed headless (whether Excel truncates it to 0 or refuses it as negative is not checked; LibreOffice: #VALUE!)`);
}

export function addText(t: Table): void {
  t.set("LEN", textFn(1, 1, (s) => s.length));
  t.set("UPPER", textFn(1, 1, (s) => s.toUpperCase()));
  t.set("LOWER", textFn(1, 1, (s) => s.toLowerCase()));
  t.set("TRIM", textFn(1, 1, (s) => s.replace(/ +/g, " ").replace(/^ | $/g, "")));
  t.set("CLEAN", textFn(1, 1, (s) => s.replace(/[\u0000-\u001f]/g, "")));
  t.set("LEFT", textFn(1, 2, (s, a) => {
    fractionalNegative("LEFT", a[1]);
    const n = int(a[1], 1);
    if (isError(n)) return n;
    return n < 0 ? err("#VALUE!", "LEFT of a negative count") : s.slice(0, n);
  }));
  t.set("RIGHT", textFn(1, 2, (s, a) => {
    fractionalNegative("RIGHT", a[1]);
    const n = int(a[1], 1);
    if (isError(n)) return n;
    return n < 0 ? err("#VALUE!", "RIGHT of a negative count") : n === 0 ? "" : s.slice(-n);
  }));
  t.set("MID", textFn(3, 3, (s, a) => {
    const start = int(a[1]);
    if (isError(start)) return start;
    fractionalNegative("MID", a[2]);
    const n = int(a[2]);
    if (isError(n)) return n;
    if (start < 1 || n < 0) return err("#VALUE!", "MID's start must be at least 1 and its length at least 0");
    return s.slice(start - 1, start - 1 + n);
  }));
  t.set("REPT", textFn(2, 2, (s, a) => {
    fractionalNegative("REPT", a[1]);
    const n = int(a[1]);
    if (isError(n)) return n;
    if (n < 0) return err("#VALUE!", "REPT of a negative count");
    return s.length * n > 32767 ? err("#VALUE!", "text longer than 32,767 characters") : s.repeat(n);
  }));
  t.set("EXACT", scalarFn(2, 2, ([a, b]) => {
    const x = text(a);
    if (isError(x)) return x;
    const y = text(b);
    if (isError(y)) return y;
    return x === y;
  }));
  t.set("SUBSTITUTE", scalarFn(3, 4, ([a, b, c, d]) => {
    const s = text(a);
    if (isError(s)) return s;
    const from = text(b);
    if (isError(from)) return from;
    const to = text(c);
    if (isError(to)) return to;
    if (from === "") return s;
    if (d === undefined) return s.split(from).join(to);
    const k = int(d);
    if (isError(k)) return k;
    if (k < 1) return err("#VALUE!", "SUBSTITUTE's instance must be at least 1");
    // Instances do not overlap (SUBSTITUTE("aaa","aa","b",2) has no second one), as without instance_num.
    let at = -from.length;
    for (let i = 0; i < k; i++) {
      at = s.indexOf(from, at + from.length);
      if (at < 0) return s;
    }
    return s.slice(0, at) + to + s.slice(at + from.length);
  }));
  const find = (caseless: boolean) =>
    scalarFn(2, 3, ([a, b, c]) => {
      const needle = text(a);
      if (isError(needle)) return needle;
      const hay = text(b);
      if (isError(hay)) return hay;
      const start = int(c, 1);
      if (isError(start)) return start;
      if (start < 1 || start > hay.length + 1) return err("#VALUE!", "the start position is outside the text");
      let at: number;
      if (!caseless) at = hay.indexOf(needle, start - 1);
      else if (!/[*?~]/.test(needle)) at = hay.toUpperCase().indexOf(needle.toUpperCase(), start - 1);
      else {
        // SEARCH's wildcards: ? one character, * any run, ~ before either takes it literally.
        let re = "";
        for (let i = 0; i < needle.length; i++) {
          const ch = needle[i] as string;
          if (ch === "~" && i + 1 < needle.length && "*?~".includes(needle[i + 1] as string)) re += (needle[++i] as string).replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
          else if (ch === "*") re += "[\\s\\S]*?";
          else if (ch === "?") re += "[\\s\\S]";
          else re += ch.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
        }
        const m = new RegExp(re, "i").exec(hay.slice(start - 1));
        at = m ? m.index + start - 1 : -1;
      }
      return at < 0 ? err("#VALUE!", "the text is not found") : at + 1;
    });
  t.set("FIND", find(false));
  t.set("SEARCH", find(true));
  t.set("CONCATENATE", {
    min: 1,
    max: 255,
    call: (args) => {
      let s = "";
      for (const a of args) {
        const x = text(a as Scalar | undefined);
        if (isError(x)) return x;
        s += x;
      }
      return s.length > 32767 ? err("#VALUE!", "text longer than 32,767 characters") : s;
    },
  });
  t.set("CONCAT", { min: 1, max: 254, param: classes("R"), noLift: true, call: (a, ctx) => concatAll(a, ctx) });
  t.set("TEXTJOIN", {
    min: 3,
    max: 252,
    param: classes("V", "V", "R"),
    noLift: true,
    call: ([sep, skip, ...rest], ctx) => {
      if (sep instanceof XlArray) return notComputed("TEXTJOIN with an array of delimiters is not computed headless");
      const d = text(sep as Scalar | undefined);
      if (isError(d)) return d;
      if (skip instanceof XlArray) return notComputed("TEXTJOIN with an array for ignore_empty is not computed headless");
      // ignore_empty left empty is FALSE, and "TRUE"/"FALSE" read as logical values (as LibreOffice computes).
      const ignore = bool(skip as Scalar | undefined);
      if (isError(ignore)) return ignore;
      // Keeping empty values keeps blank cells of ranges too: a range is read whole, not cell by cell.
      const parts = ignore ? rest : rest.map((r) => (r instanceof XlRef ? toArray(r, ctx) : r));
      return concatAll(parts, ctx, d, ignore);
    },
  });
  t.set("VALUE", textFn(1, 1, (s) => {
    const n = numberFromText(s);
    return n === undefined ? notComputed(`VALUE("${s.slice(0, 40)}") depends on the computer's locale; not computed headless`) : n;
  }));
  t.set("CHAR", scalarFn(1, 1, ([a]) => {
    const n = int(a);
    if (isError(n)) return n;
    if (n < 1 || n > 255) return err("#VALUE!", "CHAR takes 1 to 255");
    if (n > 127) return notComputed("CHAR above 127 depends on the computer's code page; not computed headless");
    return String.fromCharCode(n);
  }));
  t.set("CODE", textFn(1, 1, (s) => {
    if (s === "") return err("#VALUE!", "CODE of empty text");
    const c = s.charCodeAt(0);
    return c > 127 ? notComputed("CODE above 127 depends on the computer's code page; not computed headless") : c;
  }));
  t.set("TEXT", scalarFn(2, 2, () => notComputed("TEXT's format codes depend on the computer's locale; not computed headless")));

  // Dates
  t.set("DATE", {
    min: 3,
    max: 3,
    call: ([y, m, d], ctx) => {
      const a = num(y as Scalar);
      if (isError(a)) return a;
      const b = num(m as Scalar);
      if (isError(b)) return b;
      const c = num(d as Scalar);
      if (isError(c)) return c;
      return dateSerial(a, b, c, ctx.host.date1904);
    },
  });
  t.set("YEAR", datePart("y"));
  t.set("MONTH", datePart("m"));
  t.set("DAY", datePart("d"));
  const serialArg = (v: Scalar | undefined, ctx: Ctx): number | XlError => {
    if (typeof v === "string") {
      const iso = isoDateSerial(v, ctx.host.date1904);
      if (iso !== undefined) return iso;
      const n = numberFromText(v);
      if (n === undefined) return notComputed(`reading the date in text "${v.slice(0, 40)}" depends on the computer's locale; not computed headless`);
      return n;
    }
    return num(v);
  };
  t.set("DATEVALUE", {
    min: 1,
    max: 1,
    call: ([v], ctx) => {
      const x = text(v as Scalar);
      if (isError(x)) return x;
      const iso = isoDateSerial(x, ctx.host.date1904);
      if (iso === undefined) return notComputed(`DATEVALUE("${x.slice(0, 40)}"): only ISO dates (2025-01-02) read the same in every locale; not computed headless`);
      return Math.floor(iso);
    },
  });
  t.set("TIME", scalarFn(3, 3, ([h, m, sec]) => {
    const a = int(h);
    if (isError(a)) return a;
    const b = int(m);
    if (isError(b)) return b;
    const c = int(sec);
    if (isError(c)) return c;
    // A negative fraction: truncated toward 0 or floored, the answers differ (TIME(0,0,-0.5) is 0
    // or #NUM!) and which Excel does is not established (LibreOffice: #VALUE!).
    for (const x of [h, m, sec]) {
      const n = num(x as Scalar);
      if (!isError(n) && n < 0 && !Number.isInteger(n)) return notComputed(`TIME with a negative fraction (${n}) is not computed headless (whether Excel truncates it toward 0 or down is not established; LibreOffice gives #VALUE!)`);
    }
    // Microsoft Support, TIME: hour, minute and second are each a number from 0 to 32767.
    if (Math.max(a, b, c) > 32767) return notComputed("TIME with an argument above 32767 (outside the range Microsoft documents) is not computed headless");
    const total = a * 3600 + b * 60 + c;
    if (total < 0) return err("#NUM!", "a negative time");
    return (total % 86400) / 86400;
  }));
  const timePart = (div: number, mod: number) =>
    ({
      min: 1,
      max: 1,
      call: ([v]: readonly (Value | undefined)[], ctx: Ctx): Scalar => {
        const n = serialArg(v as Scalar, ctx);
        if (isError(n)) return n;
        if (n < 0) return err("#NUM!", "a negative time");
        const exact = (n - Math.floor(n)) * 86400;
        const secs = Math.round(exact);
        // Half a second or more before a full minute: rounded, the minute (and hour) goes up;
        // LibreOffice truncates there. Which Excel does is not checked.
        const frac = exact - Math.floor(exact);
        if (div > 1 && secs % 60 === 0 && frac >= 0.5 && frac < 1 - 1e-6) return notComputed(`${div === 3600 ? "HOUR" : "MINUTE"} of a time less than a second before a full minute is not computed headless (rounded to the second it is the next minute; whether Excel rounds or truncates here is not checked)`);
        return Math.floor(secs / div) % mod;
      },
    }) as const;
  t.set("HOUR", timePart(3600, 24));
  t.set("MINUTE", timePart(60, 60));
  t.set("SECOND", timePart(1, 60));
  t.set("WEEKDAY", {
    min: 1,
    max: 2,
    call: ([v, type], ctx) => {
      const n = serialArg(v as Scalar, ctx);
      if (isError(n)) return n;
      if (n < 0) return err("#NUM!", "a negative date");
      const k = int(type as Scalar | undefined, 1);
      if (isError(k)) return k;
      // Day of the week counted as Excel counts it: serial 1 (1900-01-01 in its calendar) is a Sunday.
      const base = ctx.host.date1904 ? 6 : 0; // serial 0 of the 1904 system, 1 January 1904, was a Friday
      const sunday0 = (((Math.floor(n) + base - 1) % 7) + 7) % 7; // 0 = Sunday
      const starts: Record<number, [number, number]> = { 1: [0, 1], 2: [1, 1], 3: [1, 0], 11: [1, 1], 12: [2, 1], 13: [3, 1], 14: [4, 1], 15: [5, 1], 16: [6, 1], 17: [0, 1] };
      const s = starts[k];
      if (!s) return err("#NUM!", `WEEKDAY type ${k} is not one Excel has`);
      return ((sunday0 - s[0] + 7) % 7) + s[1];
    },
  });
  const monthsFrom = (ctx: Ctx, start: Scalar | undefined, months: Scalar | undefined, endOfMonth: boolean): Scalar => {
    const n = serialArg(start, ctx);
    if (isError(n)) return n;
    const k = int(months);
    if (isError(k)) return k;
    const d = serialDate(n, ctx.host.date1904);
    if (isError(d)) return d;
    if (endOfMonth) return dateSerial(d.y, d.m + k + 1, 0, ctx.host.date1904);
    const last = new Date(Date.UTC(d.y, d.m - 1 + k + 1, 0)).getUTCDate();
    return dateSerial(d.y, d.m + k, Math.min(d.d, last), ctx.host.date1904);
  };
  t.set("EDATE", { min: 2, max: 2, call: ([a, b], ctx) => monthsFrom(ctx, a as Scalar, b as Scalar, false) });
  t.set("EOMONTH", { min: 2, max: 2, call: ([a, b], ctx) => monthsFrom(ctx, a as Scalar, b as Scalar, true) });
  t.set("DAYS", {
    min: 2,
    max: 2,
    call: ([e, s], ctx) => {
      const a = serialArg(e as Scalar, ctx);
      if (isError(a)) return a;
      const b = serialArg(s as Scalar, ctx);
      if (isError(b)) return b;
      // Microsoft's DAYS: "if both date arguments are numbers, DAYS uses EndDate–StartDate" (fractions kept).
      return a - b;
    },
  });
  t.set("DATEDIF", {
    min: 3,
    max: 3,
    call: ([s, e, u], ctx) => {
      const a = serialArg(s as Scalar, ctx);
      if (isError(a)) return a;
      const b = serialArg(e as Scalar, ctx);
      if (isError(b)) return b;
      const unit = text(u as Scalar);
      if (isError(unit)) return unit;
      if (a > b) return err("#NUM!", "DATEDIF's start date is after its end date");
      const x = serialDate(Math.floor(a), ctx.host.date1904);
      const y = serialDate(Math.floor(b), ctx.host.date1904);
      if (isError(x)) return x;
      if (isError(y)) return y;
      let months = (y.y - x.y) * 12 + (y.m - x.m);
      if (y.d < x.d) months -= 1;
      switch (unit.toUpperCase()) {
        case "D":
          return Math.floor(b) - Math.floor(a);
        case "M":
          return months;
        case "Y":
          return Math.floor(months / 12);
        case "YM":
          return months % 12;
        default:
          return notComputed(`DATEDIF with unit "${unit}" is not computed headless (Microsoft documents known problems with "MD"; "YD" is not checked)`);
      }
    },
  });
  t.set("TODAY", { min: 0, max: 0, dynamic: true, call: (_a, ctx) => Math.floor(ctx.host.now()) });
  t.set("NOW", { min: 0, max: 0, dynamic: true, call: (_a, ctx) => ctx.host.now() });
}
