using System.Reflection;
using System.Reflection.Emit;
using System.Text.RegularExpressions;
using SettingLint.Core.Linting;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>
/// Core's folders follow the data flow (DEVELOPERS.md, house rules): each may use only the folders before it. A
/// <c>using</c>, a qualified name or a compiled reference (a call, a field, a type in a signature) that goes back up
/// fails here, with the file or type that makes it.
/// </summary>
public sealed partial class LayeringTests
{
    /// <summary>
    /// The order, first to last. Documents, Quantities, Findings and Model are the foundations every step shares; then
    /// discover, load (and the sources files are read from), validate, bind, evaluate (Rules, then the configuration
    /// that sets them), the engine's run, the gate, fixes (they re-check fixed files through the gate's selection and
    /// an overlay), and the one entry point the front ends call.
    /// </summary>
    public static readonly string[] Order =
    [
        "Documents", "Quantities", "Findings", "Model",
        "Discovery", "Loading", "Sources", "Validation", "Binding", "Rules", "Configuration", "Engine", "Gate", "Fixes", "Linting",
    ];

    private static readonly string CoreFolder = Path.Combine(RepositoryPaths.Root(), "src", "SettingLint.Core");

    private static readonly Assembly Core = typeof(Linter).Assembly;

    [Fact]
    public void Every_folder_of_Core_has_its_place_in_the_order()
    {
        var folders = Directory.GetDirectories(CoreFolder).Select(Path.GetFileName).Where(n => n is not ("bin" or "obj")).ToList();
        Assert.All(folders, f => Assert.Contains(f, Order));
        Assert.Contains("Linting", folders);
        // Every source file lies in one of them, and its namespace is its folder's.
        foreach (var file in SourceFiles())
        {
            var folder = FolderOf(file);
            Assert.Contains($"namespace SettingLint.Core.{folder};", File.ReadAllText(file), StringComparison.Ordinal);
        }
    }

    [Fact]
    public void No_source_file_names_a_later_folder()
    {
        var types = TypesByFolder();
        var violations = SourceFiles().SelectMany(f => Violations(FolderOf(f), File.ReadAllText(f), types).Select(v => Path.GetRelativePath(CoreFolder, f) + ": " + v)).ToList();
        Assert.True(violations.Count == 0, "Uses that go back up the data flow:\n" + string.Join("\n", violations));
    }

    [Fact]
    public void The_source_check_finds_a_using_and_a_qualified_name_that_go_back_up()
    {
        var types = TypesByFolder();
        Assert.Equal(["uses SettingLint.Core.Gate"], Violations("Engine", "using SettingLint.Core.Gate;\nnamespace SettingLint.Core.Engine;\n", types));
        Assert.Equal(["uses SettingLint.Core.Engine"], Violations("Rules", "using X = SettingLint.Core.Engine.Checker;\n", types));
        Assert.Equal(["names Gate.Baseline"], Violations("Engine", "namespace SettingLint.Core.Engine;\nclass A { Gate.Baseline? b; }\n", types));
        Assert.Equal(["names Linting.Linter"], Violations("Gate", "class A { object o = SettingLint.Core.Linting.Linter.Check; }\n", types));
        // Earlier folders, a property that happens to share a folder's name, and comments are fine.
        Assert.Empty(Violations("Gate", "using SettingLint.Core.Engine;\n// Linting.Linter is above\nclass A { void F(Session s) { _ = s.Rules.Rules; } }\n", types));
    }

    [Fact]
    public void No_compiled_type_of_Core_refers_to_a_later_folder()
    {
        var violations = new SortedSet<string>(StringComparer.Ordinal);
        foreach (var type in Core.GetTypes())
        {
            var from = FolderOfNamespace(type.Namespace);
            if (from < 0) continue;
            foreach (var used in References(type))
            {
                var to = FolderOfNamespace(used.Namespace);
                if (used.Assembly == Core && to > from) violations.Add($"{type.FullName} uses {used.FullName}");
            }
        }
        Assert.True(violations.Count == 0, "References that go back up the data flow:\n" + string.Join("\n", violations));
    }

    [Fact]
    public void The_compiled_check_sees_a_call_in_a_method_body()
    {
        // This test class (outside Core) calls the entry point only inside a method body: the scan must see it.
        Assert.Contains(References(typeof(Probe)), t => t == typeof(Linter));
    }

    private static class Probe
    {
        public static object Run() => Linter.Check(new CheckRequest("/", []));
    }

    [GeneratedRegex(@"^\s*(?:global\s+)?using\s+(?:static\s+)?(?:\w+\s*=\s*)?SettingLint\.Core\.(?<folder>\w+)", RegexOptions.Multiline)]
    private static partial Regex UsingLine();

    [GeneratedRegex(@"(?<![\w.])(?:SettingLint\.Core\.)?(?<folder>[A-Z]\w*)\.(?<type>[A-Z]\w*)")]
    private static partial Regex QualifiedName();

    /// <summary>What a file of a folder uses of later folders: <c>using</c> lines, and names written as Folder.Type.</summary>
    internal static List<string> Violations(string folder, string text, IReadOnlyDictionary<string, HashSet<string>> types)
    {
        var own = Array.IndexOf(Order, folder);
        var found = new List<string>();
        var code = string.Join('\n', text.Split('\n').Select(l => l.TrimStart().StartsWith("//", StringComparison.Ordinal) ? "" : l));
        foreach (Match m in UsingLine().Matches(code))
        {
            if (Array.IndexOf(Order, m.Groups["folder"].Value) > own) found.Add("uses SettingLint.Core." + m.Groups["folder"].Value);
        }
        foreach (Match m in QualifiedName().Matches(code))
        {
            var target = m.Groups["folder"].Value;
            if (UsingLineAt(code, m.Index)) continue;
            if (Array.IndexOf(Order, target) > own && types.TryGetValue(target, out var names) && names.Contains(m.Groups["type"].Value))
            {
                found.Add("names " + target + "." + m.Groups["type"].Value);
            }
        }
        return found;
    }

    private static bool UsingLineAt(string code, int index)
    {
        var start = code.LastIndexOf('\n', Math.Max(0, index - 1)) + 1;
        return code.AsSpan(start).TrimStart().StartsWith("using ", StringComparison.Ordinal);
    }

    private static Dictionary<string, HashSet<string>> TypesByFolder() =>
        Order.ToDictionary(f => f, f => Core.GetTypes().Where(t => t.Namespace == "SettingLint.Core." + f).Select(t => t.Name.Split('`')[0]).ToHashSet(StringComparer.Ordinal));

    private static int FolderOfNamespace(string? ns) =>
        ns is not null && ns.StartsWith("SettingLint.Core.", StringComparison.Ordinal) ? Array.IndexOf(Order, ns["SettingLint.Core.".Length..].Split('.')[0]) : -1;

    private static IEnumerable<string> SourceFiles() =>
        Directory.GetFiles(CoreFolder, "*.cs", SearchOption.AllDirectories)
            .Where(f => !f.Contains(Path.DirectorySeparatorChar + "obj" + Path.DirectorySeparatorChar, StringComparison.Ordinal)
                && !f.Contains(Path.DirectorySeparatorChar + "bin" + Path.DirectorySeparatorChar, StringComparison.Ordinal))
            .Order(StringComparer.Ordinal);

    private static string FolderOf(string file) => Path.GetRelativePath(CoreFolder, file).Split(Path.DirectorySeparatorChar)[0];

    private const BindingFlags Declared = BindingFlags.DeclaredOnly | BindingFlags.Public | BindingFlags.NonPublic | BindingFlags.Instance | BindingFlags.Static;

    /// <summary>Every type a type refers to: base, interfaces, fields, signatures, and what its method bodies call, read or make.</summary>
    internal static IEnumerable<Type> References(Type type)
    {
        var found = new HashSet<Type>();
        void Add(Type? t)
        {
            if (t is null) return;
            if (t.HasElementType) { Add(t.GetElementType()); return; }
            if (t.IsGenericType && !t.IsGenericTypeDefinition)
            {
                foreach (var a in t.GetGenericArguments()) Add(a);
                Add(t.GetGenericTypeDefinition());
                return;
            }
            if (!t.IsGenericParameter) found.Add(t);
        }
        Add(type.BaseType);
        foreach (var i in type.GetInterfaces()) Add(i);
        foreach (var f in type.GetFields(Declared)) Add(f.FieldType);
        foreach (var p in type.GetProperties(Declared)) Add(p.PropertyType);
        var methods = type.GetMethods(Declared).Cast<MethodBase>().Concat(type.GetConstructors(Declared));
        foreach (var m in methods)
        {
            if (m is MethodInfo mi) Add(mi.ReturnType);
            foreach (var p in m.GetParameters()) Add(p.ParameterType);
            foreach (var t in BodyReferences(m)) Add(t);
        }
        return found;
    }

    private static readonly Dictionary<short, OpCode> OpCodesByValue = typeof(OpCodes).GetFields(BindingFlags.Public | BindingFlags.Static)
        .Select(f => (OpCode)f.GetValue(null)!).ToDictionary(o => o.Value);

    /// <summary>The types whose members or tokens a method body uses, read from its IL.</summary>
    private static IEnumerable<Type> BodyReferences(MethodBase method)
    {
        var il = method.GetMethodBody()?.GetILAsByteArray();
        if (il is null) yield break;
        var module = method.Module;
        var typeArgs = method.DeclaringType is { IsGenericType: true } d ? d.GetGenericArguments() : null;
        var methodArgs = method.IsGenericMethod ? method.GetGenericArguments() : null;
        var i = 0;
        while (i < il.Length)
        {
            short value = il[i] == 0xFE && i + 1 < il.Length ? (short)(0xFE00 | il[i + 1]) : il[i];
            i += value > 0xFF || value < 0 ? 2 : 1;
            if (!OpCodesByValue.TryGetValue(value, out var op)) yield break;
            int size = op.OperandType switch
            {
                OperandType.InlineNone => 0,
                OperandType.ShortInlineBrTarget or OperandType.ShortInlineI or OperandType.ShortInlineVar => 1,
                OperandType.InlineVar => 2,
                OperandType.InlineI8 or OperandType.InlineR => 8,
                OperandType.InlineSwitch => 4 + (4 * BitConverter.ToInt32(il, i)),
                _ => 4,
            };
            if (op.OperandType is OperandType.InlineField or OperandType.InlineMethod or OperandType.InlineTok or OperandType.InlineType)
            {
                var token = BitConverter.ToInt32(il, i);
                MemberInfo? member = null;
                try
                {
                    member = module.ResolveMember(token, typeArgs, methodArgs);
                }
                catch (ArgumentException)
                {
                }
                if (member is Type t) yield return t;
                else if (member?.DeclaringType is { } owner) yield return owner;
                if (member is FieldInfo fi) yield return fi.FieldType;
                if (member is MethodInfo called)
                {
                    yield return called.ReturnType;
                    if (called.IsGenericMethod) foreach (var a in called.GetGenericArguments()) yield return a;
                }
            }
            i += size;
        }
    }
}
