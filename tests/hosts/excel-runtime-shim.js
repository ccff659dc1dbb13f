/*
 * Source of the API it mimics: @types/custom-functions-runtime (CustomFunctions.associate, Error,
 * ErrorCode) and the runtime copy in @microsoft/office-js. Stands in for Office's custom-functions-runtime.js when the built page runs in plain Chromium
 * (there is no Excel here). It plays the part of Excel's runtime that the add-in touches:
 * CustomFunctions.associate (recorded, ids upper-cased as the real runtime does),
 * CustomFunctions.Error and CustomFunctions.ErrorCode (the same codes and fields as the real
 * runtime's copy in @microsoft/office-js 1.1.110). A test hook, window.__soilHost, lets the test
 * call an associated function the way Excel would and read the result back.
 */
(function () {
  "use strict";
  var ErrorCode = {
    invalidValue: "#VALUE!",
    notAvailable: "#N/A",
    divisionByZero: "#DIV/0!",
    invalidNumber: "#NUM!",
    nullReference: "#NULL!",
    invalidName: "#NAME?",
    invalidReference: "#REF!",
  };
  var known = Object.keys(ErrorCode).map(function (k) { return ErrorCode[k]; });

  class CustomFunctionsError extends Error {
    constructor(code, message) {
      super(message || "");
      if (known.indexOf(code) < 0) throw new TypeError("CustomFunctions.Error: unknown error code " + String(code));
      this.code = code;
      this.message = message || "";
      this.name = "CustomFunctions.Error";
    }
  }

  var associations = {};
  var calls = [];
  var problems = [];

  function associate(id, fn) {
    if (arguments.length === 1 && id && typeof id === "object") {
      Object.keys(id).forEach(function (k) { associate(k, id[k]); });
      return;
    }
    calls.push(String(id));
    if (typeof id !== "string" || typeof fn !== "function") {
      problems.push("associate(" + String(id) + ", " + typeof fn + "): needs an id string and a function");
      return;
    }
    var key = id.toUpperCase();
    if (associations[key]) problems.push("associate: " + key + " associated twice");
    associations[key] = fn;
  }

  window.CustomFunctions = { associate: associate, Error: CustomFunctionsError, ErrorCode: ErrorCode };

  /** A result cell as plain data the test can read; errors keep what Excel would show. */
  function cellOut(v) {
    if (v instanceof CustomFunctionsError) return { error: v.code, message: v.message, isCustomFunctionsError: true };
    if (v instanceof Error) return { unexpected: "a plain Error: " + v.message };
    if (typeof v === "number") {
      if (!isFinite(v)) return { unexpected: "a non-finite number: " + String(v) };
      return v;
    }
    if (typeof v === "string") return v;
    if (v === null) return { unexpected: "null" };
    return { unexpected: typeof v + ": " + String(v) };
  }

  window.__soilHost = {
    calls: calls,
    problems: problems,
    ids: function () { return Object.keys(associations).sort(); },
    /** Calls the function associated with `id` with Excel-shaped arguments. */
    call: function (id, args) {
      var fn = associations[id.toUpperCase()];
      if (!fn) return { notAssociated: id };
      var out;
      try {
        out = fn.apply(null, args);
      } catch (e) {
        return { threw: String(e && e.message ? e.message : e) };
      }
      if (out && typeof out.then === "function") return { unexpected: "a Promise (the functions are synchronous)" };
      var isMatrix = Array.isArray(out) && out.length > 0 && out.every(function (r) { return Array.isArray(r) && r.length === out[0].length; });
      if (!isMatrix) return { notMatrix: String(out) };
      return { rows: out.map(function (r) { return r.map(cellOut); }) };
    },
  };
})();
