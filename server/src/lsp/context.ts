// What every handler receives: the connection, open documents, the analysis cache, settings.
import type { Connection } from 'vscode-languageserver/node';
import type { OpenDocuments } from './documents';
import type { AnalysisCache } from './analyses';
import type { Settings } from './settings';

export interface ServerContext {
  connection: Connection;
  documents: OpenDocuments;
  analyses: AnalysisCache;
  settings: Settings;
  /** Client capabilities the handlers adapt to. */
  client: {
    configuration: boolean;
    resourceCreate: boolean;
    hierarchicalSymbols: boolean;
    /** The client runs `thermoscribe.showGenerated` itself (it said so in `initializationOptions.clientCommands`). */
    showGenerated: boolean;
  };
}
