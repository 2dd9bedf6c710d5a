using System.Text.Json;
using System.Text.Json.Serialization;

namespace SettingLint.Cli.Server;

// The few Language Server Protocol 3.17 types the server reads and writes, written here because no protocol-types
// package is used. Names and shapes follow the specification; optional fields are nullable and left out when null.

/// <summary>A zero-based line and UTF-16 character offset (LSP Position).</summary>
public sealed record LspPosition(int Line, int Character);

/// <summary>A range whose end is exclusive (LSP Range).</summary>
public sealed record LspRange(LspPosition Start, LspPosition End);

/// <summary>Names a document (LSP TextDocumentIdentifier).</summary>
public sealed record TextDocumentIdentifier(string Uri);

/// <summary>A document with the version of its content (LSP VersionedTextDocumentIdentifier).</summary>
public sealed record VersionedTextDocumentIdentifier(string Uri, int Version);

/// <summary>A document as opened (LSP TextDocumentItem).</summary>
public sealed record TextDocumentItem(string Uri, string LanguageId, int Version, string Text);

/// <summary>A workspace folder given at initialization.</summary>
public sealed record WorkspaceFolder(string Uri, string? Name = null);

/// <summary>What the server reads of the initialize request; the client's capabilities are not needed.</summary>
public sealed record InitializeParams(string? RootUri = null, string? RootPath = null, IReadOnlyList<WorkspaceFolder>? WorkspaceFolders = null);

/// <summary>The server's name and version.</summary>
public sealed record ServerInfo(string Name, string? Version);

/// <summary>Options of full-text synchronisation: open/close, full content on change, save notifications.</summary>
/// <param name="Change">1 = full content (TextDocumentSyncKind.Full).</param>
public sealed record TextDocumentSyncOptions(bool OpenClose, int Change, SaveOptions Save);

/// <summary>Whether save notifications carry the text.</summary>
public sealed record SaveOptions(bool IncludeText);

/// <summary>What the server offers.</summary>
public sealed record ServerCapabilities(TextDocumentSyncOptions TextDocumentSync, bool HoverProvider, bool CodeActionProvider = false);

/// <summary>The answer to initialize.</summary>
public sealed record InitializeResult(ServerCapabilities Capabilities, ServerInfo ServerInfo);

/// <summary>textDocument/didOpen.</summary>
public sealed record DidOpenTextDocumentParams(TextDocumentItem TextDocument);

/// <summary>One change; without a range it is the whole new text.</summary>
public sealed record TextDocumentContentChangeEvent(string Text, LspRange? Range = null);

/// <summary>textDocument/didChange.</summary>
public sealed record DidChangeTextDocumentParams(VersionedTextDocumentIdentifier TextDocument, IReadOnlyList<TextDocumentContentChangeEvent> ContentChanges);

/// <summary>textDocument/didSave.</summary>
public sealed record DidSaveTextDocumentParams(TextDocumentIdentifier TextDocument, string? Text = null);

/// <summary>textDocument/didClose.</summary>
public sealed record DidCloseTextDocumentParams(TextDocumentIdentifier TextDocument);

/// <summary>One file event of workspace/didChangeWatchedFiles (type 1 created, 2 changed, 3 deleted).</summary>
public sealed record FileEvent(string Uri, int Type);

/// <summary>workspace/didChangeWatchedFiles.</summary>
public sealed record DidChangeWatchedFilesParams(IReadOnlyList<FileEvent> Changes);

/// <summary>A link to a rule's description (LSP CodeDescription).</summary>
public sealed record CodeDescription(string Href);

/// <summary>One diagnostic; severity 1 error, 2 warning, 3 information, 4 hint.</summary>
public sealed record Diagnostic(LspRange Range, int Severity, string? Code, CodeDescription? CodeDescription, string Source, string Message);

/// <summary>textDocument/publishDiagnostics.</summary>
public sealed record PublishDiagnosticsParams(string Uri, int? Version, IReadOnlyList<Diagnostic> Diagnostics);

/// <summary>textDocument/hover and other position requests.</summary>
public sealed record TextDocumentPositionParams(TextDocumentIdentifier TextDocument, LspPosition Position);

/// <summary>Formatted text (kind markdown or plaintext).</summary>
public sealed record MarkupContent(string Kind, string Value);

/// <summary>The answer to hover.</summary>
public sealed record Hover(MarkupContent Contents, LspRange? Range = null);

/// <summary>textDocument/codeAction: the document and the range the client asks about (its diagnostics are not needed).</summary>
public sealed record CodeActionParams(TextDocumentIdentifier TextDocument, LspRange Range);

/// <summary>Replaces the text of a range (LSP TextEdit).</summary>
public sealed record TextEdit(LspRange Range, string NewText);

/// <summary>Edits by document URI (LSP WorkspaceEdit with <c>changes</c>).</summary>
public sealed record WorkspaceEdit(IReadOnlyDictionary<string, IReadOnlyList<TextEdit>> Changes);

/// <summary>A code action: a fix as a quick fix with its edit, and the diagnostics it resolves.</summary>
/// <param name="Kind">quickfix.</param>
public sealed record CodeAction(string Title, string Kind, IReadOnlyList<Diagnostic>? Diagnostics = null, bool? IsPreferred = null, WorkspaceEdit? Edit = null);

/// <summary>window/logMessage and window/showMessage (type 1 error, 2 warning, 3 info, 4 log).</summary>
public sealed record LogMessageParams(int Type, string Message);

/// <summary>
/// Source-generated serialization of the protocol types, so that the server needs no reflection over them
/// (the CLI is published with NativeAOT).
/// </summary>
// Required constructor parameters and non-nullable references are enforced, so that a message of the wrong shape is
// refused when it is read (InvalidParams) instead of failing later on a null.
[JsonSourceGenerationOptions(PropertyNamingPolicy = JsonKnownNamingPolicy.CamelCase, DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
    RespectNullableAnnotations = true, RespectRequiredConstructorParameters = true)]
[JsonSerializable(typeof(InitializeParams))]
[JsonSerializable(typeof(InitializeResult))]
[JsonSerializable(typeof(DidOpenTextDocumentParams))]
[JsonSerializable(typeof(DidChangeTextDocumentParams))]
[JsonSerializable(typeof(DidSaveTextDocumentParams))]
[JsonSerializable(typeof(DidCloseTextDocumentParams))]
[JsonSerializable(typeof(DidChangeWatchedFilesParams))]
[JsonSerializable(typeof(PublishDiagnosticsParams))]
[JsonSerializable(typeof(TextDocumentPositionParams))]
[JsonSerializable(typeof(Hover))]
[JsonSerializable(typeof(CodeActionParams))]
[JsonSerializable(typeof(IReadOnlyList<CodeAction>))]
[JsonSerializable(typeof(LogMessageParams))]
[JsonSerializable(typeof(IReadOnlyList<Diagnostic>))]
[JsonSerializable(typeof(JsonElement))]
// The error data StreamJsonRpc attaches to an error answer for an exception.
[JsonSerializable(typeof(StreamJsonRpc.Protocol.CommonErrorData))]
[JsonSerializable(typeof(object))]
[JsonSerializable(typeof(string))]
[JsonSerializable(typeof(int))]
[JsonSerializable(typeof(int?))]
public sealed partial class LspJson : JsonSerializerContext;
