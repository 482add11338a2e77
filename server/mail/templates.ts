import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Liquid, type Template } from "liquidjs";
import { MAIL_TEMPLATES, type MailTemplateName } from "../../shared/schemas/mail";

/** templates/mail/, independent of the working directory. */
export const MAIL_TEMPLATE_DIR = fileURLToPath(new URL("../../templates/mail", import.meta.url));

/** A person as mail templates see them. */
export interface MailPerson {
  displayName: string;
}

/** What every notification template receives. */
export interface MailCommon {
  appName: string;
  /** Absolute link to the page the mail is about. */
  link: string;
  project: { name: string; slug: string };
  design: { name: string; kind: "waveform" | "filter" };
  revision: { number: number };
  actor: MailPerson;
}

/** The data each template expects; strict variables make a missing field an error, not a blank. */
export interface MailData {
  submitted: MailCommon & { note: string };
  approved: MailCommon & { comment: string };
  "changes-requested": MailCommon & { comment: string };
  released: MailCommon & { release: { version: string; notes: string } };
  withdrawn: MailCommon & { release: { version: string }; reason: string };
  verified: MailCommon & { release: { version: string }; run: MailVerificationRun };
}

/** A verification run as the `verified` mail shows it (texts preformatted; empty strings when absent). */
export interface MailVerificationRun {
  vectorSet: string;
  verdict: "pass" | "fail";
  compared: number;
  mismatches: number;
  /** "" on a pass; else e.g. "sample 17: expected (12, -3), got (13, -3)". */
  firstMismatch: string;
  simulator: string;
  rtlRevision: string;
  uploadSha256: string;
  /** The release was withdrawn when the run arrived. */
  withdrawn: boolean;
}

/** A rendered message, ready for the outbox. */
export interface RenderedMail {
  subject: string;
  text: string;
  html: string;
}

interface Compiled {
  subject: Template[];
  text: Template[];
  html: Template[];
}

function engine(outputEscape?: "escape"): Liquid {
  return new Liquid({
    root: [MAIL_TEMPLATE_DIR],
    partials: [MAIL_TEMPLATE_DIR],
    layouts: [MAIL_TEMPLATE_DIR],
    extname: ".liquid",
    // Partials resolve inside templates/mail only (no ../ lookups relative to the including file).
    relativeReference: false,
    strictVariables: true,
    strictFilters: true,
    ownPropertyOnly: true,
    outputEscape,
  });
}

/** Renders the subject, plain-text and HTML parts of the templates in templates/mail/. */
export class MailTemplates {
  private readonly plain = engine();
  // HTML output escapes every {{ }} by default, so names and comments cannot inject markup.
  private readonly html = engine("escape");
  private readonly compiled = new Map<MailTemplateName, Compiled>();

  constructor(private readonly dir = MAIL_TEMPLATE_DIR) {}

  private load(name: MailTemplateName): Compiled {
    const hit = this.compiled.get(name);
    if (hit) return hit;
    if (!MAIL_TEMPLATES.includes(name)) throw new RangeError(`unknown mail template "${String(name)}"`);
    const read = (part: string) => readFileSync(path.join(this.dir, `${name}.${part}.liquid`), "utf8");
    const c: Compiled = {
      subject: this.plain.parse(read("subject")),
      text: this.plain.parse(read("text")),
      html: this.html.parse(read("html")),
    };
    this.compiled.set(name, c);
    return c;
  }

  /** Render all three parts; the subject is folded to one line (SMTP headers cannot hold newlines). */
  async render<T extends MailTemplateName>(name: T, data: MailData[T]): Promise<RenderedMail> {
    const c = this.load(name);
    const scope = data as unknown as Record<string, unknown>;
    const [subject, text, html] = await Promise.all([
      this.plain.render(c.subject, scope) as Promise<string>,
      this.plain.render(c.text, scope) as Promise<string>,
      this.html.render(c.html, scope) as Promise<string>,
    ]);
    return { subject: subject.replace(/\s+/g, " ").trim(), text: tidyText(text), html };
  }
}

/** Drop trailing spaces and runs of blank lines left by template tags; end with one newline. */
function tidyText(s: string): string {
  return `${s
    .replace(/[ \t]+$/gm, "")
    .replace(/\n{3,}/g, "\n\n")
    .trim()}\n`;
}

let shared: MailTemplates | undefined;
/** The process-wide renderer over templates/mail/ (templates are parsed once). */
export function mailTemplates(): MailTemplates {
  shared ??= new MailTemplates();
  return shared;
}
