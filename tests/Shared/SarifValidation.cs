using System.Diagnostics;
using System.Text;
using System.Text.Json;
using NJsonSchema;

namespace SettingLint.Tests.Shared;

/// <summary>
/// Checks SARIF logs two ways: against the SARIF 2.1.0 JSON schema that the Sarif.Sdk NuGet package ships
/// (Schemata/sarif-2.1.0.json, found in the NuGet packages folder), and with the SARIF SDK's own validator,
/// the npm package @microsoft/sarif-multitool, which also applies hosted code scanning's rules.
/// </summary>
public static class SarifValidation
{
    /// <summary>The environment variable that names the multitool binary (set by .ci/run).</summary>
    public const string MultitoolVariable = "SETTINGLINT_SARIF_MULTITOOL";

    private const string SarifSdkVersion = "5.8.0";

    private static readonly Lazy<JsonSchema> Schema = new(LoadSchema, LazyThreadSafetyMode.ExecutionAndPublication);

    /// <summary>Where the schema is read from: Sarif.Sdk's package folder under NUGET_PACKAGES or ~/.nuget/packages.</summary>
    public static string SchemaPath()
    {
        var candidates = new List<string>();
        var configured = Environment.GetEnvironmentVariable("NUGET_PACKAGES");
        if (!string.IsNullOrEmpty(configured)) candidates.Add(configured);
        candidates.Add(Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), ".nuget", "packages"));
        foreach (var root in candidates)
        {
            var path = Path.Combine(root, "sarif.sdk", SarifSdkVersion, "Schemata", "sarif-2.1.0.json");
            if (File.Exists(path)) return path;
        }
        throw new FileNotFoundException(
            "The SARIF schema of Sarif.Sdk " + SarifSdkVersion + " was not found under: " + string.Join(", ", candidates) +
            ". Restore the test project (it downloads the package) or set NUGET_PACKAGES.");
    }

    /// <summary>The schema errors of a SARIF log, one readable line each (empty when it is valid).</summary>
    public static IReadOnlyList<string> SchemaErrors(string sarifJson)
    {
        ArgumentNullException.ThrowIfNull(sarifJson);
        var errors = Schema.Value.Validate(sarifJson);
        return errors.Select(Describe).OrderBy(static line => line, StringComparer.Ordinal).ToList();
    }

    /// <summary>The multitool binary: the environment variable, else the repository's .tools folder; null when absent.</summary>
    public static string? MultitoolPath()
    {
        var configured = Environment.GetEnvironmentVariable(MultitoolVariable);
        if (!string.IsNullOrEmpty(configured)) return configured;
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (!File.Exists(Path.Combine(dir.FullName, "SettingLint.sln"))) continue;
            var path = Path.Combine(dir.FullName, ".tools", "node_modules", "@microsoft", "sarif-multitool-linux", "Sarif.Multitool");
            return File.Exists(path) ? path : null;
        }
        return null;
    }

    /// <summary>
    /// Runs <c>Sarif.Multitool validate FILE -o OUT --rule-kind "Sarif;Ghas"</c> and reads OUT (itself a SARIF log):
    /// the number of results at level error, and the tool's console output listing every result.
    /// </summary>
    /// <exception cref="InvalidOperationException">The multitool is not installed, fails, or writes no output.</exception>
    public static (int Errors, string Output) RunMultitool(string sarifPath)
    {
        ArgumentNullException.ThrowIfNull(sarifPath);
        var tool = MultitoolPath() ?? throw new InvalidOperationException(
            "Sarif.Multitool not found: set " + MultitoolVariable + " or run `npm install @microsoft/sarif-multitool` in .tools.");
        if (!File.Exists(tool)) throw new InvalidOperationException("Sarif.Multitool not found at " + tool + " (from " + MultitoolVariable + ").");
        EnsureExecutable(tool);

        var outPath = Path.Combine(Path.GetTempPath(), "settinglint-multitool-" + Guid.NewGuid().ToString("N") + ".sarif");
        try
        {
            var start = new ProcessStartInfo(tool)
            {
                RedirectStandardOutput = true,
                RedirectStandardError = true,
                UseShellExecute = false,
            };
            foreach (var arg in new[] { "validate", Path.GetFullPath(sarifPath), "-o", outPath, "--rule-kind", "Sarif;Ghas", "--log", "ForceOverwrite" })
            {
                start.ArgumentList.Add(arg);
            }
            // The tool is a self-contained .NET app: do not make it depend on ICU being installed.
            start.Environment["DOTNET_SYSTEM_GLOBALIZATION_INVARIANT"] = "1";

            using var process = Process.Start(start) ?? throw new InvalidOperationException("Could not start " + tool);
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(TimeSpan.FromSeconds(120)))
            {
                process.Kill(entireProcessTree: true);
                throw new InvalidOperationException("Sarif.Multitool did not finish within 120 s.");
            }
            var console = stdout.GetAwaiter().GetResult() + stderr.GetAwaiter().GetResult();
            if (!File.Exists(outPath))
            {
                throw new InvalidOperationException("Sarif.Multitool wrote no output (exit code " + process.ExitCode + "):\n" + console);
            }
            var (errors, listing) = ReadValidatorLog(File.ReadAllText(outPath));
            return (errors, listing + console);
        }
        finally
        {
            File.Delete(outPath);
        }
    }

    // A result's level is its own, else its rule's default, else warning (SARIF 3.27.10).
    private static (int Errors, string Listing) ReadValidatorLog(string json)
    {
        using var doc = JsonDocument.Parse(json);
        var errors = 0;
        var listing = new StringBuilder();
        foreach (var run in doc.RootElement.GetProperty("runs").EnumerateArray())
        {
            var rules = run.GetProperty("tool").GetProperty("driver").TryGetProperty("rules", out var r) ? r : default;
            if (!run.TryGetProperty("results", out var results)) continue;
            foreach (var result in results.EnumerateArray())
            {
                var level = result.TryGetProperty("level", out var l) ? l.GetString() : null;
                if (level is null && rules.ValueKind == JsonValueKind.Array && result.TryGetProperty("ruleIndex", out var index)
                    && rules[index.GetInt32()].TryGetProperty("defaultConfiguration", out var config)
                    && config.TryGetProperty("level", out var defaultLevel))
                {
                    level = defaultLevel.GetString();
                }
                level ??= "warning";
                if (level == "error") errors++;
                var ruleId = result.TryGetProperty("ruleId", out var id) ? id.GetString() : "?";
                listing.Append(level).Append(' ').Append(ruleId).Append('\n');
            }
        }
        return (errors, listing.ToString());
    }

    private static void EnsureExecutable(string path)
    {
        if (OperatingSystem.IsWindows() || !File.Exists(path)) return;
        var mode = File.GetUnixFileMode(path);
        if ((mode & UnixFileMode.UserExecute) == 0) File.SetUnixFileMode(path, mode | UnixFileMode.UserExecute);
    }

    private static JsonSchema LoadSchema() =>
        JsonSchema.FromFileAsync(SchemaPath()).GetAwaiter().GetResult();

    private static string Describe(NJsonSchema.Validation.ValidationError error)
    {
        var line = error.Kind + " at " + error.Path + (error.HasLineInfo ? $" (line {error.LineNumber}, column {error.LinePosition})" : "");
        if (error is NJsonSchema.Validation.ChildSchemaValidationError child)
        {
            line += " {" + string.Join("; ", child.Errors.SelectMany(static e => e.Value).Select(Describe)) + "}";
        }
        return line;
    }
}
