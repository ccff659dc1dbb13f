/** Types for xml.js (the strict XML tokenizer used by the oracle and the tests). */
export interface Attr {
  readonly name: string;
  readonly value: string;
  readonly start: number;
  readonly end: number;
}

export interface Token {
  readonly kind: "open" | "close" | "empty" | "text" | "cdata" | "comment" | "pi" | "decl";
  readonly start: number;
  readonly end: number;
  readonly name?: string;
  readonly attrs?: Attr[];
  readonly text?: string;
}

export interface Element {
  readonly name: string;
  readonly ns: string;
  readonly local: string;
  readonly attrs: Map<string, string>;
  readonly attrTokens: Attr[];
  readonly children: (Element | TextNode)[];
  readonly start: number;
  readonly end: number;
  readonly open: Token;
  readonly close?: Token;
  readonly nsMap: Map<string, string>;
}

export interface TextNode {
  readonly text: string;
  readonly start: number;
  readonly end: number;
  readonly cdata: boolean;
}

export class XmlError extends Error {}
export function tokenize(xml: string): Token[];
export function parse(xml: string): Element;
export function textOf(el: Element): string;
export function childrenNamed(el: Element, local: string, ns?: string): Element[];
export function escapeXml(s: string): string;
export function decodeEntities(s: string, at?: number): string;
