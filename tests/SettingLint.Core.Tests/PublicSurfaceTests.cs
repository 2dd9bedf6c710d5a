using System.Reflection;
using System.Text.RegularExpressions;
using SettingLint.Core.Linting;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>
/// Core is public only where a front end needs it (the command line with its language server, the sheets and the
/// report): a public type of Core is one a front end names in its source, or one that a public member of such a type
/// exposes (a parameter, a result, a property, a base type). Anything else is internal, so that the engine's inside
/// can change without a front end noticing. The tests reach internals through InternalsVisibleTo.
/// </summary>
public sealed partial class PublicSurfaceTests
{
    private static readonly string[] FrontEnds = ["SettingLint.Cli", "SettingLint.Sheets", "SettingLint.Reporting"];

    [Fact]
    public void Every_public_type_of_Core_is_named_by_a_front_end_or_exposed_by_one_that_is()
    {
        var root = RepositoryPaths.Root();
        var words = new HashSet<string>(StringComparer.Ordinal);
        foreach (var project in FrontEnds)
        {
            foreach (var file in Directory.EnumerateFiles(Path.Combine(root, "src", project), "*.cs", SearchOption.AllDirectories))
            {
                if (file.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}", StringComparison.Ordinal)) continue;
                foreach (Match m in Word().Matches(File.ReadAllText(file))) words.Add(m.Value);
            }
        }

        var exported = typeof(Linter).Assembly.GetExportedTypes().Where(t => !t.IsNested).ToHashSet();
        // Start from what the front ends name (an extension class counts when they call one of its methods), then add
        // whatever the public members of those types expose, until nothing new comes in.
        var needed = exported.Where(t => words.Contains(BareName(t)) || ExtensionMethodNames(t).Any(words.Contains)).ToHashSet();
        var queue = new Queue<Type>(needed);
        while (queue.Count > 0)
        {
            foreach (var exposed in Exposed(queue.Dequeue()))
            {
                var top = exposed;
                while (top.IsNested) top = top.DeclaringType!;
                if (exported.Contains(top) && needed.Add(top)) queue.Enqueue(top);
            }
        }

        var needless = exported.Except(needed).Select(t => t.FullName).Order(StringComparer.Ordinal).ToList();
        Assert.True(needless.Count == 0, "Public in Core but no front end needs it (make it internal): " + string.Join(", ", needless));
        // The front door stays open: the one entry point and its request are public.
        Assert.Contains(typeof(Linter), needed);
        Assert.Contains(typeof(CheckRequest), needed);
    }

    private static string BareName(Type t) => t.Name.Split('`')[0];

    private static IEnumerable<string> ExtensionMethodNames(Type t) =>
        t.IsAbstract && t.IsSealed
            ? t.GetMethods(BindingFlags.Public | BindingFlags.Static).Where(m => m.IsDefined(typeof(System.Runtime.CompilerServices.ExtensionAttribute), false)).Select(m => m.Name)
            : [];

    /// <summary>Every type named in the public signature of <paramref name="t"/> and its public nested types.</summary>
    private static IEnumerable<Type> Exposed(Type t)
    {
        const BindingFlags Public = BindingFlags.Public | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly;
        var direct = new List<Type>();
        if (t.BaseType is { } b) direct.Add(b);
        direct.AddRange(t.GetInterfaces());
        foreach (var f in t.GetFields(Public)) direct.Add(f.FieldType);
        foreach (var p in t.GetProperties(Public)) direct.Add(p.PropertyType);
        foreach (var m in t.GetMethods(Public))
        {
            direct.Add(m.ReturnType);
            direct.AddRange(m.GetParameters().Select(p => p.ParameterType));
        }
        foreach (var c in t.GetConstructors(BindingFlags.Public | BindingFlags.Instance)) direct.AddRange(c.GetParameters().Select(p => p.ParameterType));
        foreach (var n in t.GetNestedTypes(BindingFlags.Public)) direct.AddRange(Exposed(n).Append(n));
        return direct.SelectMany(Unwrap);
    }

    private static IEnumerable<Type> Unwrap(Type t)
    {
        if (t.HasElementType) return Unwrap(t.GetElementType()!);
        if (t.IsGenericType) return t.GetGenericArguments().SelectMany(Unwrap).Append(t.GetGenericTypeDefinition());
        return [t];
    }

    [GeneratedRegex(@"\b[A-Z][A-Za-z0-9_]*\b")]
    private static partial Regex Word();
}
