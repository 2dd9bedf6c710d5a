using System.Text.Json.Nodes;
using SettingLint.Cli.Server;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests.Server;

/// <summary>The language server driven in-process through a pipe by a client that speaks the wire format itself.</summary>
public sealed class LanguageServerTests
{
    private const string WrongPickup = "    pickup: 46 A pri";

    /// <summary>The 0-based line of the first line of a text that starts with a prefix.</summary>
    private static int LineOf(string text, string prefix) =>
        Array.FindIndex(text.Split('\n'), l => l.StartsWith(prefix, StringComparison.Ordinal));

    private static string[] Codes(JsonArray diagnostics) => [.. diagnostics.Select(d => (string)d!["code"]!).Order(StringComparer.Ordinal)];

    /// <summary>The rule ids `check` reports for one file of a repository as it is on disk, sorted.</summary>
    internal static string[] CheckCodes(TempRepo repo, string relativePath) =>
        [.. Cli.Run("check", repo.Root, "--format", "json").Findings.Where(f => f.File == relativePath).Select(f => f.Rule).Order(StringComparer.Ordinal)];

    private static string[] Without(string[] codes, params string[] removed) => [.. codes.Where(c => !removed.Contains(c))];

    [Fact]
    public async Task Open_change_hover_and_exit_over_a_pipe()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        var text = File.ReadAllText(motor);
        var line = LineOf(text, WrongPickup);
        Assert.True(line > 0);
        var onDisk = CheckCodes(repo, "motors/p-202.yaml");
        await using var session = await ServerSession.Start(repo.Root);
        await session.Open(motor, text);

        var first = await session.Client.Diagnostics(ServerSession.Uri(motor), 1);
        // The demo's keyed-in mistake: 46 A entered as primary is far below the asymmetrical starting current (SL201) and
        // below the relay model's 200 A minimum (SL108); and its planted hot safe stall above the cold one (SL102).
        Assert.Equal(onDisk, Codes(first));
        Assert.Contains("SL102", onDisk);
        Assert.Contains("SL108", onDisk);
        Assert.Contains("SL201", onDisk);
        var sl201 = first.Single(d => (string)d!["code"]! == "SL201")!;
        Assert.Equal(1, (int)sl201["severity"]!);
        Assert.Equal("settinglint", (string)sl201["source"]!);
        Assert.Equal(line, (int)sl201["range"]!["start"]!["line"]!);
        Assert.Equal("    pickup: ".Length, (int)sl201["range"]!["start"]!["character"]!);
        Assert.Equal(WrongPickup.Length, (int)sl201["range"]!["end"]!["character"]!);
        Assert.EndsWith("#sl201", (string)sl201["codeDescription"]!["href"]!, StringComparison.Ordinal);

        // Fixed in the buffer only (the file on disk still has the mistake): 46 A secondary through the 200/5 A CT.
        await session.Change(motor, 2, text.Replace(WrongPickup, "    pickup: 46 A sec", StringComparison.Ordinal));
        var second = await session.Client.Diagnostics(ServerSession.Uri(motor), 2);
        Assert.Equal(Without(onDisk, "SL108", "SL201"), Codes(second));

        // 46 A sec x 200/5 = 1840 A primary (CT ratio, IEEE C57.13 marked ratio); the value as written and both sides.
        var hover = await session.Hover(motor, line, "    pickup: 4".Length);
        Assert.NotNull(hover);
        Assert.Contains("- written: 46 A sec", hover, StringComparison.Ordinal);
        Assert.Contains("- primary: 1.84 kA", hover, StringComparison.Ordinal);
        Assert.Contains("- secondary: 46 A (transformer ratio 40)", hover, StringComparison.Ordinal);
        Assert.Contains("Window: short-circuit pickup: at least 1.76 kA pri", hover, StringComparison.Ordinal);

        var element = await session.Hover(motor, LineOf(text, "  short_circuit:"), 4);
        Assert.NotNull(element);
        Assert.Contains("**short-circuit** `protection.short_circuit`", element, StringComparison.Ordinal);
        Assert.Contains("Setting windows:", element, StringComparison.Ordinal);
        // 948 A locked rotor at 4000 V is 1036 A at the bus's 4370 V maximum; SL201's 1.7 x asymmetry gives 1761 A, so
        // 1840 A passes by (1840 - 1761) / 1761 = 4.5 %, inside the report's 10 % near-miss share.
        Assert.Contains("- SL201 near miss", element, StringComparison.Ordinal);
        Assert.Contains("(+4.5", element, StringComparison.Ordinal);
        Assert.DoesNotContain("fails", element, StringComparison.Ordinal);

        // A comment line has nothing to hover.
        Assert.Null(await session.Hover(motor, line - 1, 6));
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    // The demo's P-202 has 46 A keyed in as primary: SL201 (common practice: at least 1.7 x the 1036 A start at the bus's
    // 4370 V, so 1761 A) and SL108 (below the relay's 1.00 xCT = 200 A minimum of a 200:5 CT). The relay sets the pickup
    // in steps of 0.01 xCT = 2 A pri, so the lowest step above 1761 A is 1762 A, written as primary as the file writes it.
    [Fact]
    public async Task A_fix_is_a_code_action_that_replaces_exactly_the_value()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        var text = File.ReadAllText(motor);
        var line = LineOf(text, WrongPickup);
        await using var session = await ServerSession.Start(repo.Root);
        await session.Open(motor, text);
        await session.Client.Diagnostics(ServerSession.Uri(motor), 1);

        var answer = await session.Client.Request("textDocument/codeAction", new JsonObject
        {
            ["textDocument"] = new JsonObject { ["uri"] = ServerSession.Uri(motor) },
            ["range"] = new JsonObject { ["start"] = new JsonObject { ["line"] = line, ["character"] = 6 }, ["end"] = new JsonObject { ["line"] = line, ["character"] = 6 } },
            ["context"] = new JsonObject { ["diagnostics"] = new JsonArray() },
        });
        var actions = answer["result"]!.AsArray();
        var action = Assert.Single(actions)!;
        Assert.Equal("quickfix", (string)action["kind"]!);
        Assert.Equal(["SL108", "SL201"], Codes(action["diagnostics"]!.AsArray()));
        var edits = action["edit"]!["changes"]![ServerSession.Uri(motor)]!.AsArray();
        var edit = Assert.Single(edits)!;
        Assert.Equal("1762 A pri", (string)edit["newText"]!);
        // Exactly "46 A pri": from after "    pickup: " to the end of the unit, on the finding's line.
        Assert.Equal((line, "    pickup: ".Length, line, WrongPickup.Length),
            ((int)edit["range"]!["start"]!["line"]!, (int)edit["range"]!["start"]!["character"]!, (int)edit["range"]!["end"]!["line"]!, (int)edit["range"]!["end"]!["character"]!));

        // Applied as the editor applies it, the two findings go and nothing else changes.
        var lines = text.Split('\n');
        lines[line] = lines[line][..(int)edit["range"]!["start"]!["character"]!] + (string)edit["newText"]! + lines[line][(int)edit["range"]!["end"]!["character"]!..];
        var onDisk = CheckCodes(repo, "motors/p-202.yaml");
        await session.Change(motor, 2, string.Join('\n', lines));
        Assert.Equal(Without(onDisk, "SL108", "SL201"), Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 2)));

        // A line with no fix has no action.
        var none = await session.Client.Request("textDocument/codeAction", new JsonObject
        {
            ["textDocument"] = new JsonObject { ["uri"] = ServerSession.Uri(motor) },
            ["range"] = new JsonObject { ["start"] = new JsonObject { ["line"] = 0, ["character"] = 0 }, ["end"] = new JsonObject { ["line"] = 0, ["character"] = 0 } },
            ["context"] = new JsonObject { ["diagnostics"] = new JsonArray() },
        });
        Assert.Empty(none["result"]!.AsArray());
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task Every_demo_file_gets_the_findings_of_check()
    {
        using var repo = ServerSession.DemoRepo();
        var check = Cli.Run("check", repo.Root, "--format", "json");
        Assert.Equal(1, check.Exit);
        var expected = check.Json.GetProperty("findings").EnumerateArray().Select(f => (
            File: f.GetProperty("file").GetString()!,
            Rule: f.GetProperty("ruleId").GetString()!,
            Level: f.GetProperty("level").GetString()!,
            Line: f.GetProperty("line").GetInt32(),
            Column: f.GetProperty("column").GetInt32(),
            EndLine: f.GetProperty("endLine").GetInt32(),
            EndColumn: f.GetProperty("endColumn").GetInt32(),
            Message: f.GetProperty("message").GetString()!)).ToList();
        Assert.True(expected.Count >= 5, check.ToString());

        await using var session = await ServerSession.Start(repo.Root);
        var files = Directory.EnumerateFiles(repo.Root, "*.yaml", SearchOption.AllDirectories)
            .Select(f => Path.GetRelativePath(repo.Root, f).Replace('\\', '/')).Where(f => !f.StartsWith('.')).Order(StringComparer.Ordinal).ToList();
        foreach (var rel in files) await session.Open(repo.PathOf(rel), File.ReadAllText(repo.PathOf(rel)));
        var actual = new List<(string, string, string, int, int, int, int, string)>();
        foreach (var rel in files)
        {
            foreach (var d in await session.Client.Diagnostics(ServerSession.Uri(repo.PathOf(rel)), 1))
            {
                var level = (int)d!["severity"]! switch { 1 => "error", 2 => "warning", _ => "note" };
                actual.Add((rel, (string)d["code"]!, level,
                    (int)d["range"]!["start"]!["line"]! + 1, (int)d["range"]!["start"]!["character"]! + 1,
                    (int)d["range"]!["end"]!["line"]! + 1, (int)d["range"]!["end"]!["character"]! + 1, (string)d["message"]!));
            }
        }
        Assert.Equal(expected.Order(), actual.Order());
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task An_unsaved_bus_edit_rediagnoses_the_open_motor_on_that_bus_as_check_does_once_saved()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        var bus = repo.PathOf("buses/sg-41a.yaml");
        var busText = File.ReadAllText(bus);
        // SL201's starting current is the locked-rotor current scaled to the bus's maximum voltage (locked-rotor current
        // proportional to the applied voltage: common practice), so its limit moves with max_voltage.
        var edited = busText.Replace("max_voltage: 4370 V", "max_voltage: 4160 V", StringComparison.Ordinal);
        Assert.NotEqual(busText, edited);
        await using var session = await ServerSession.Start(repo.Root);
        await session.Open(motor, File.ReadAllText(motor));
        await session.Open(bus, busText);
        var before = await session.Client.Diagnostics(ServerSession.Uri(motor), 1);
        var mark = session.Client.Notifications.Count;

        await session.Change(bus, 2, edited);
        var after = await session.Client.Diagnostics(ServerSession.Uri(motor), 1, mark);
        string Sl201(JsonArray d) => (string)d.Single(x => (string)x!["code"]! == "SL201")!["message"]!;
        Assert.NotEqual(Sl201(before), Sl201(after));

        // The same edit saved and checked from the disk gives the same message.
        File.WriteAllText(bus, edited);
        var check = Cli.Run("check", repo.Root, "--format", "json");
        var expected = check.Json.GetProperty("findings").EnumerateArray()
            .Single(f => f.GetProperty("file").GetString() == "motors/p-202.yaml" && f.GetProperty("ruleId").GetString() == "SL201");
        Assert.Equal(expected.GetProperty("message").GetString(), Sl201(after));
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task A_saved_configuration_applies_to_the_open_files()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        await using var session = await ServerSession.Start(repo.Root);
        var onDisk = CheckCodes(repo, "motors/p-202.yaml");
        await session.Open(motor, File.ReadAllText(motor));
        Assert.Contains("SL102", Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 1)));
        var mark = session.Client.Notifications.Count;

        var config = repo.PathOf(".settinglint.yaml");
        File.AppendAllText(config, "rules:\n  SL102: off\n");
        await session.Save(config);
        var after = await session.Client.Diagnostics(ServerSession.Uri(motor), 1, mark);
        Assert.Equal(Without(onDisk, "SL102"), Codes(after));
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task An_unsaved_configuration_edit_applies_to_the_open_files_and_undoing_it_restores_them()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        await using var session = await ServerSession.Start(repo.Root);
        var onDisk = CheckCodes(repo, "motors/p-202.yaml");
        await session.Open(motor, File.ReadAllText(motor));
        Assert.Contains("SL102", Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 1)));

        // The configuration is edited in the editor and not saved: the motor is checked as the buffer says.
        var config = repo.PathOf(".settinglint.yaml");
        var text = File.ReadAllText(config);
        await session.Open(config, text);
        var mark = session.Client.Notifications.Count;
        await session.Change(config, 2, text + "rules:\n  SL102: off\n");
        Assert.Equal(Without(onDisk, "SL102"), Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 1, mark)));

        // The edit undone, the finding is back, though nothing was ever written to the disk.
        mark = session.Client.Notifications.Count;
        await session.Change(config, 3, text);
        Assert.Equal(onDisk, Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 1, mark)));
        Assert.Equal(text, File.ReadAllText(config));
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task An_unsaved_edit_of_a_company_rule_rediagnoses_the_open_motors()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-201.yaml");
        await using var session = await ServerSession.Start(repo.Root);
        await session.Open(motor, File.ReadAllText(motor));
        Assert.DoesNotContain("TWE101", Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 1)));

        // The firm's ride-through minimum raised from 2 s to 10 s in the editor, not saved: P-201's 6.5 s 27 delay is now short.
        var rule = repo.PathOf("firm-rules/TWE101/rule.yaml");
        var text = File.ReadAllText(rule);
        Assert.Contains("default: 2 s", text, StringComparison.Ordinal);
        await session.Open(rule, text);
        var mark = session.Client.Notifications.Count;
        await session.Change(rule, 2, text.Replace("default: 2 s", "default: 10 s", StringComparison.Ordinal));
        Assert.Contains("TWE101", Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 1, mark)));
        Assert.Equal(text, File.ReadAllText(rule));
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task A_file_that_becomes_clean_gets_empty_diagnostics_and_a_closed_one_is_cleared()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-502.yaml");
        var text = File.ReadAllText(motor);
        await using var session = await ServerSession.Start(repo.Root);
        await session.Open(motor, text);
        Assert.Empty(await session.Client.Diagnostics(ServerSession.Uri(motor), 1));

        await session.Change(motor, 2, text.Replace("kind: motor-protection", "kind: motor-protection\n  broken: [", StringComparison.Ordinal));
        Assert.Equal(["SL001"], Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 2)));
        await session.Change(motor, 3, text);
        Assert.Empty(await session.Client.Diagnostics(ServerSession.Uri(motor), 3));

        await session.Change(motor, 4, text.Replace("kind: motor-protection", "kind: motor-protection\n  broken: [", StringComparison.Ordinal));
        Assert.NotEmpty(await session.Client.Diagnostics(ServerSession.Uri(motor), 4));
        var mark = session.Client.Notifications.Count;
        await session.Close(motor);
        var cleared = await session.Client.WaitFor(n => (string?)n["method"] == "textDocument/publishDiagnostics", mark);
        Assert.Empty(cleared["params"]!["diagnostics"]!.AsArray());
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task A_broken_buffer_gives_SL001_and_the_next_request_is_answered()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        await using var session = await ServerSession.Start(repo.Root);
        await session.Open(motor, "kind: motor-protection\nformat: 1\ntag: [unclosed\n  : : :\n\t\u0000");
        var broken = await session.Client.Diagnostics(ServerSession.Uri(motor), 1);
        Assert.Contains("SL001", Codes(broken));
        Assert.Null(await session.Hover(motor, 0, 0));

        // Parameters of the wrong shape are an error answer to that request only.
        var bad = await session.Client.Request("textDocument/hover", new JsonObject { ["textDocument"] = "not an object", ["position"] = 3 });
        Assert.NotNull(bad["error"]);
        await session.Client.Notify("textDocument/didChange", new JsonObject { ["contentChanges"] = "nothing" });
        await session.Client.Notify("$/unknownNotification", new JsonObject());
        var unknown = await session.Client.Request("settinglint/noSuchMethod", new JsonObject());
        Assert.Equal(-32601, (int)unknown["error"]!["code"]!);

        await session.Change(motor, 2, File.ReadAllText(motor));
        Assert.Equal(CheckCodes(repo, "motors/p-202.yaml"), Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 2)));
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task An_exception_while_checking_does_not_end_the_session()
    {
        using var repo = ServerSession.DemoRepo();
        var motor = repo.PathOf("motors/p-202.yaml");
        var text = File.ReadAllText(motor);
        var calls = 0;
        var options = new ServerOptions(TimeSpan.Zero)
        {
            BeforeCheck = _ =>
            {
                if (Interlocked.Increment(ref calls) == 1) throw new InvalidOperationException("injected failure");
            },
        };
        await using var session = await ServerSession.Start(repo.Root, options);
        await session.Open(motor, text);
        var log = await session.Client.WaitFor(n => (string?)n["method"] == "window/logMessage");
        Assert.Contains("injected failure", (string)log["params"]!["message"]!, StringComparison.Ordinal);
        Assert.Equal(1, (int)log["params"]!["type"]!);

        await session.Change(motor, 2, text);
        Assert.Contains("SL201", Codes(await session.Client.Diagnostics(ServerSession.Uri(motor), 2)));
        Assert.Contains("injected failure", session.Errors.ToString(), StringComparison.Ordinal);
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    [Fact]
    public async Task Exit_without_shutdown_ends_with_code_1()
    {
        using var repo = ServerSession.DemoRepo();
        await using var session = await ServerSession.Start(repo.Root);
        await session.Client.Notify("exit");
        Assert.Equal(1, await session.Server.WaitAsync(LspClient.Timeout));
    }
}
