// Minimal types for the two mail packages that ship none (only what server/mail uses).
declare module "smtp-server" {
  import type { Server } from "node:net";
  import type { Readable } from "node:stream";

  export interface SMTPServerAddress {
    address: string;
  }
  export interface SMTPServerSession {
    id: string;
    remoteAddress: string;
    envelope: { mailFrom: SMTPServerAddress | false; rcptTo: SMTPServerAddress[] };
  }
  export interface SMTPServerDataStream extends Readable {
    sizeExceeded?: boolean;
  }
  export interface SMTPServerOptions {
    authOptional?: boolean;
    disabledCommands?: string[];
    logger?: boolean;
    size?: number;
    banner?: string;
    name?: string;
    hideSTARTTLS?: boolean;
    onData?(
      stream: SMTPServerDataStream,
      session: SMTPServerSession,
      callback: (err?: Error | null) => void,
    ): void;
  }
  export class SMTPServer {
    constructor(options?: SMTPServerOptions);
    server: Server;
    listen(port: number, host: string, callback?: () => void): Server;
    close(callback?: () => void): void;
    on(event: "error", listener: (err: Error) => void): this;
    once(event: "error", listener: (err: Error) => void): this;
    off(event: "error", listener: (err: Error) => void): this;
  }
}

declare module "mailparser" {
  export interface ParsedMail {
    subject?: string;
    text?: string;
    html: string | false;
    messageId?: string;
  }
  export function simpleParser(source: Buffer | string): Promise<ParsedMail>;
}
