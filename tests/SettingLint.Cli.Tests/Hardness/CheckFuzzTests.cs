using System.Text;
using CsCheck;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;

namespace SettingLint.Cli.Tests.Hardness;

/// <summary>
/// Mutated setting files through the whole check with the built-in pack: never an internal error, never exit 3,
/// and every finding has a place in its file.
/// </summary>
public sealed class CheckFuzzTests
{
    private static readonly string Motor = File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "examples", "motors", "p-201.yaml"));
    private static readonly string Bus = File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "examples", "buses", "sg-41a.yaml"));

    private static readonly string[] Garbage =
    [
        "1_000 A", "6.2xFLC", ".nan", "-.inf", "1e309 A", "-5 s", "0 A pri", "1e-320 A sec", "NaN A", "∞ s", "5 parsecs",
        "{", "[", "&a", "*a", "!!binary x", "? x", "|", ">-", "\"unterminated", "'", "\t", "\u0000", "\uFEFF", "---", "...",
        "null", "~", "yes", "0x1F A", "99999999999999999999999999 A", "7.2 A", "7.2 A sec sec", "%", "% %",
    ];

    private static readonly Gen<string> Mutated = Gen.OneOf(
        // truncated
        Gen.Int[0, Motor.Length].Select(n => Motor[..n]),
        // a line replaced by garbage, or a value garbled
        Gen.Select(Gen.Int[0, 200], Gen.Int[0, Garbage.Length - 1], (line, g) => ReplaceLine(Motor, line, Garbage[g])),
        Gen.Select(Gen.Int[0, 200], Gen.Int[0, Garbage.Length - 1], (line, g) => ReplaceValue(Motor, line, Garbage[g])),
        // a line duplicated (duplicate keys)
        Gen.Int[0, 200].Select(line => DuplicateLine(Motor, line)),
        // deep nesting, several documents, empty documents
        Gen.Int[1, 300].Select(depth => Motor + "\nextra: " + new string('[', depth) + new string(']', depth) + "\n"),
        Gen.Int[1, 5].Select(n => string.Join("\n---\n", Enumerable.Repeat(Motor, n))),
        Gen.Const(""), Gen.Const("---\n...\n"), Gen.Const("kind:\n"), Gen.Const("kind: motor-protection\n"),
        // bytes flipped
        Gen.Select(Gen.Int[0, Motor.Length - 1], Gen.Char[' ', '~'], (i, c) => Motor[..i] + c + Motor[(i + 1)..]));

    private static string ReplaceLine(string text, int line, string with)
    {
        var lines = text.Split('\n');
        lines[line % lines.Length] = with;
        return string.Join('\n', lines);
    }

    private static string ReplaceValue(string text, int line, string with)
    {
        var lines = text.Split('\n');
        var i = line % lines.Length;
        var colon = lines[i].IndexOf(": ", StringComparison.Ordinal);
        if (colon > 0) lines[i] = lines[i][..(colon + 2)] + with;
        return string.Join('\n', lines);
    }

    private static string DuplicateLine(string text, int line)
    {
        var lines = text.Split('\n').ToList();
        var i = line % lines.Count;
        lines.Insert(i, lines[i]);
        return string.Join('\n', lines);
    }

    [Fact]
    public void Mutated_motor_files_never_break_the_check()
    {
        var repo = Path.Combine(Path.GetTempPath(), "settinglint-fuzz-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path.Combine(repo, ".git"));
        Directory.CreateDirectory(Path.Combine(repo, "buses"));
        Directory.CreateDirectory(Path.Combine(repo, "models"));
        Directory.CreateDirectory(Path.Combine(repo, "motors"));
        File.WriteAllText(Path.Combine(repo, "buses", "sg-41a.yaml"), Bus);
        File.Copy(Path.Combine(RepositoryPaths.Root(), "examples", "models", "standard-motor-relay.yaml"), Path.Combine(repo, "models", "standard-motor-relay.yaml"));
        try
        {
            // One fixed seed: reproducible; 400 files checked in one run of the whole pipeline.
            var inputs = Mutated.Array[400].Single(_ => true, seed: "0N0XIzNsQ0O2");
            for (var i = 0; i < inputs.Length; i++)
            {
                File.WriteAllText(Path.Combine(repo, "motors", $"m{i:000}.yaml"), inputs[i], new UTF8Encoding(false));
            }
            var session = Session.Open([repo]);
            Assert.Empty(session.Problems);
            var result = session.Check([repo], null);
            Assert.DoesNotContain(result.Notifications, n => n.Kind == NotificationKind.Internal);
            Assert.NotEqual(ExitCodes.Internal, result.ExitCode);
            foreach (var f in result.Findings)
            {
                Assert.True(f.Span.StartLine >= 1 && f.Span.StartColumn >= 1, $"{f.File}: {f.RuleId} has no position");
                Assert.False(string.IsNullOrWhiteSpace(f.Message));
            }
        }
        finally
        {
            Directory.Delete(repo, recursive: true);
        }
    }
}
