using System.Collections.Concurrent;
using System.Diagnostics.CodeAnalysis;
using SettingLint.Core.Discovery;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Sources;

namespace SettingLint.Core.Engine;

/// <summary>Resolves `bus` and `relay_model` references inside the repository root only; a path outside is refused before anything is read.</summary>
/// <typeparam name="TState">
/// The per-file state. Its annotation is the one <see cref="Lazy{T}"/> puts on its own type parameter (a Lazy made
/// without a factory calls the parameterless constructor); stating it here lets the trimmer and NativeAOT check that
/// requirement (IL2091) instead of it being hidden. Every Lazy here has a factory, so nothing extra is kept.
/// </typeparam>
internal sealed class ReferenceResolver<[DynamicallyAccessedMembers(DynamicallyAccessedMemberTypes.PublicParameterlessConstructor)] TState>(
    IFileSource source,
    ConcurrentDictionary<string, Lazy<TState>> states,
    Func<TState, BoundDocument?> bound,
    Func<string, string, TState> load)
    where TState : class
{
    private readonly string _root = source.Root;

    // Hundreds of motors name the same bus: the file-system checks of a target are made once per run.
    private readonly ConcurrentDictionary<string, EntryKind> _targetKinds = new(StringComparer.Ordinal);

    /// <summary>The state of the file a reference names, bound and of the expected kind; or null with an SL007 finding on the reference.</summary>
    public TState? Resolve(BoundDocument from, TextValue reference, string expectedKind, FindingBuilder findings)
    {
        var text = reference.Value;
        if (Path.IsPathRooted(text) || text.Contains('\0', StringComparison.Ordinal))
        {
            Add(findings, reference, EngineMessages.ReferenceAbsolute, text);
            return null;
        }
        var dir = Path.GetDirectoryName(from.Path) ?? _root;
        var full = Path.GetFullPath(Path.Combine(dir, text));
        if (!RepositoryRoot.Contains(_root, full))
        {
            Add(findings, reference, EngineMessages.ReferenceOutsideRoot, text);
            return null;
        }
        var problem = _targetKinds.GetOrAdd(full, source.Probe);
        if (problem == EntryKind.Folder)
        {
            Add(findings, reference, EngineMessages.ReferenceIsFolder, text, null, expectedKind);
            return null;
        }
        if (problem == EntryKind.Missing)
        {
            Add(findings, reference, EngineMessages.ReferenceMissing, text, RepositoryRoot.Relative(_root, full));
            return null;
        }
        if (problem == EntryKind.LinkOutside)
        {
            Add(findings, reference, EngineMessages.ReferenceThroughLink, text);
            return null;
        }
        var state = states.GetOrAdd(full, f => new Lazy<TState>(() => load(f, RepositoryRoot.Relative(_root, f)))).Value;
        var doc = bound(state);
        if (doc is null)
        {
            Add(findings, reference, EngineMessages.ReferenceDoesNotLoad, text, null, expectedKind);
            return null;
        }
        if (doc.Kind != expectedKind)
        {
            Add(findings, reference, EngineMessages.ReferenceWrongKind, text, null, expectedKind, doc.Kind);
            return null;
        }
        return state;
    }

    private static void Add(FindingBuilder findings, TextValue reference, EngineMessage message, string path, string? full = null, string? kind = null, string? actual = null)
    {
        var values = new List<(string, FindingValue)> { ("path", path) };
        if (full is not null) values.Add(("full", full));
        if (kind is not null) values.Add(("kind", kind));
        if (actual is not null) values.Add(("actual", actual));
        findings.Add(message, reference.Span, reference.Path, [.. values]);
    }
}
