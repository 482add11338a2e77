import type { ReleaseFile } from "@shared/schemas/releases";
import { Section } from "@/components/ui/page";
import { EmptyState } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { CopyButton } from "@/components/ui/copy-button";
import { formatCount } from "@/lib/format";
import { shortHash } from "@/features/reviews/lib/figures";

/** The bundle's files as its manifest lists them: path, size in bytes, SHA-256 (short, copies whole). */
export function ReleaseFiles({ files }: { files: readonly ReleaseFile[] }) {
  return (
    <Section title="Files">
      {files.length === 0 ? (
        <EmptyState title="No file list">This release was stored without a manifest.</EmptyState>
      ) : (
        <Table label="Bundle files">
          <thead>
            <tr>
              <Th>Path</Th>
              <Th numeric>Size (bytes)</Th>
              <Th>SHA-256</Th>
            </tr>
          </thead>
          <tbody>
            {files.map((f) => (
              <Tr key={f.path}>
                <Td className="font-mono text-[13px]">{f.path}</Td>
                <Td numeric className="whitespace-nowrap">
                  {formatCount(f.size)}
                </Td>
                <Td className="whitespace-nowrap">
                  {/* Short on screen, whole in the tooltip and the clipboard; the row names the file. */}
                  <span className="mr-1.5 font-mono text-[13px]" title={f.sha256}>
                    {shortHash(f.sha256)}
                  </span>
                  <CopyButton value={f.sha256} />
                </Td>
              </Tr>
            ))}
          </tbody>
        </Table>
      )}
    </Section>
  );
}
