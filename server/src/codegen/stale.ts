// Generated blocks whose spec hash no longer matches their channel: the spec changed after the code
// was generated. Pure: the caller hands over the C text (the server reads it through its document
// host, the CLI from the disk).
import type { ChannelResult } from '../analysis/types';
import { DiagnosticSink, type Diagnostic } from '../diagnostics/diagnostic';
import { channelSpecHash, conversionFilePath, generatableResults } from './channel-input';
import { orphanBlocks, scanGeneratedBlocks } from './markers';
import type { DocumentNode } from '../syntax/ast';
import type { FoundBlock } from './types';

export interface StaleBlock {
  block: FoundBlock;
  /** The channel's result in the analysis the block was compared with. */
  result: ChannelResult;
  /** Hash the block would carry if generated now. */
  currentHash: string;
}

/**
 * Blocks of `cText` for a channel of the analysis whose hash differs from the channel's current one.
 * Blocks of channels the analysis does not have (renamed, removed, or with errors) are left alone:
 * there is nothing to compare them with.
 */
export function staleBlocks(cText: string, analysis: { channels: readonly ChannelResult[] }): StaleBlock[] {
  const byName = new Map(generatableResults(analysis.channels).map((r) => [r.channel.name, r]));
  const out: StaleBlock[] = [];
  for (const block of scanGeneratedBlocks(cText).blocks) {
    const result = byName.get(block.channel);
    if (!result) continue;
    const currentHash = channelSpecHash(result.channel);
    if (currentHash !== block.hash) out.push({ block, result, currentHash });
  }
  return out;
}

/** Every channel the spec defines: the analysed ones and the channel blocks of the entry file. */
export function specChannelNames(analysis: { channels: readonly ChannelResult[]; files?: readonly { parse: { tree: DocumentNode } }[] }): Set<string> {
  const names = new Set(analysis.channels.map((r) => r.channel.name));
  for (const item of analysis.files?.[0]?.parse.tree.items ?? []) if (item.kind === 'block' && item.keyword.text === 'channel') names.add(item.name.text);
  return names;
}

/**
 * `generated-stale` diagnostics on the name of each channel whose block in a conversion file is
 * out of date, and (when the analysis carries its files) `generated-orphan` for each block of a
 * channel the spec does not define. `cPaths`: the files to compare, by default the spec's
 * `<stem>_conversion.c`; `read` gives a file's text (or undefined when absent).
 */
export function staleDiagnostics(
  analysis: { path: string; channels: readonly ChannelResult[]; files?: readonly { parse: { tree: DocumentNode } }[] },
  read: (absPath: string) => string | undefined,
  cPaths: readonly string[] = [conversionFilePath(analysis.path)],
): Diagnostic[] {
  const sink = new DiagnosticSink();
  for (const cPath of cPaths) {
    const text = read(cPath);
    if (text === undefined) continue;
    const file = cPath.split(/[\\/]/).pop() ?? cPath;
    for (const s of staleBlocks(text, analysis)) {
      const c = s.result.channel;
      sink.report('generated-stale', c.file, c.nameSpan, `the generated code for '${c.name}' in ${file} was made from an earlier version of this channel (spec ${s.block.hash}, now ${s.currentHash}); regenerate it`, { channel: c.name });
    }
    if (!analysis.files) continue;
    const names = specChannelNames(analysis);
    for (const b of orphanBlocks(text, names).orphans) {
      sink.report('generated-orphan', analysis.path, { start: 0, end: 0 }, `${file} holds a generated block for '${b.channel}', a channel this spec does not define (removed or renamed); delete the block (thermoscribe gen --prune) or restore the channel`, { channel: b.channel, codeFile: cPath });
    }
  }
  return sink.items;
}
