import type { Release } from "@shared/schemas/releases";
import { CopyButton } from "@/components/ui/copy-button";
import { Section } from "@/components/ui/page";
import { curlCommand, pullCommand, verifyCommand } from "../lib/commands";

function CommandLine({ label, command }: { label: string; command: string }) {
  return (
    <div className="flex flex-col gap-1">
      <div className="flex items-center justify-between gap-2">
        <span className="text-xs font-medium text-ink-700">{label}</span>
        <CopyButton value={command} label={`Copy ${label.toLowerCase()}`} />
      </div>
      <pre className="rounded border border-paper-300 bg-ink-900 px-3 py-2 font-mono text-[13px] break-all whitespace-pre-wrap text-paper-50">
        <code>{command}</code>
      </pre>
    </div>
  );
}

/** The lines a build script runs: the repository's puller (verifies every checksum) and a plain curl. */
export function BuildCommands({ release }: { release: Release }) {
  const origin = window.location.origin;
  return (
    <Section title="For build scripts">
      <div className="flex max-w-4xl flex-col gap-3">
        <p className="text-sm text-ink-700">
          Create a read token under{" "}
          <a className="text-signal-800 underline" href="/account#api-tokens">
            Account › API tokens
          </a>{" "}
          and export it as <code className="font-mono text-[13px]">TAPWRIGHT_TOKEN</code>. The puller checks
          the zip&rsquo;s SHA-256, every line of SHA256SUMS and the manifest before it unpacks anything.
        </p>
        <CommandLine label="Pull command" command={pullCommand(release, origin)} />
        <CommandLine label="Curl command" command={curlCommand(release, origin)} />
        <p className="text-sm text-ink-700">
          To record a verification run from the build, use a token with the{" "}
          <code className="font-mono text-[13px]">verify</code> scope; the command exits 0 on PASS and 1 on
          FAIL.
        </p>
        <CommandLine label="Verify command" command={verifyCommand(release, origin)} />
      </div>
    </Section>
  );
}
