using System.Globalization;
using System.Reflection;
using Microsoft.CodeAnalysis.Sarif;
using Newtonsoft.Json;
using Newtonsoft.Json.Serialization;
using SettingLint.Core.Findings;
using SarifBaselineState = Microsoft.CodeAnalysis.Sarif.BaselineState;
using SarifNotification = Microsoft.CodeAnalysis.Sarif.Notification;
using SarifSuppression = Microsoft.CodeAnalysis.Sarif.Suppression;

namespace SettingLint.Reporting.Tests;

/// <summary>
/// The SARIF log as the Sarif.Sdk object model builds it and Newtonsoft writes it: the implementation the product
/// used before it wrote SARIF itself, kept as the reference that <see cref="SarifReporter"/> must match. The two
/// share only the reading of an exception's type from its text.
/// </summary>
internal static class SarifReference
{
    // The result property that maps value names to their units.
    private const string UnitsProperty = "units";

    private static readonly JsonSerializer Serializer = JsonSerializer.Create(new JsonSerializerSettings
    {
        ContractResolver = new ExplicitDefaultsContractResolver(),
        Formatting = Formatting.Indented,
        Culture = CultureInfo.InvariantCulture,
    });

    /// <summary>The log as text, indented, with one final newline.</summary>
    public static string Render(CheckResult result, ReportContext context) => Serialize(Build(result, context));

    /// <summary>A log as text, written the way the product wrote it.</summary>
    public static string Serialize(SarifLog log)
    {
        // Newtonsoft indents with the writer's NewLine: pin it so output is the same on every platform.
        using var text = new StringWriter(CultureInfo.InvariantCulture) { NewLine = "\n" };
        using (var json = new JsonTextWriter(text) { Formatting = Formatting.Indented, Indentation = 2 })
        {
            Serializer.Serialize(json, log);
        }
        return text + "\n";
    }

    /// <summary>A log read back with the SDK's own model.</summary>
    public static SarifLog Deserialize(string sarif) =>
        JsonConvert.DeserializeObject<SarifLog>(sarif) ?? throw new InvalidOperationException("no SARIF log");

    /// <summary>The log in the SDK's object model.</summary>
    public static SarifLog Build(CheckResult result, ReportContext context)
    {
        var ruleIndex = new Dictionary<string, int>(StringComparer.Ordinal);
        var rules = new List<ReportingDescriptor>(result.Rules.Length);
        foreach (var rule in result.Rules)
        {
            ruleIndex.TryAdd(rule.Id, rules.Count);
            rules.Add(Rule(rule, context.Tool));
        }

        var results = new List<Result>(result.Findings.Length);
        foreach (var finding in result.Findings)
        {
            if (finding.Suppression is not null && context.OmitSuppressed) continue;
            results.Add(Result(finding, ruleIndex.TryGetValue(finding.RuleId, out var index) ? index : -1));
        }
        // Code scanning would show an absent result as an open alert, so the code-scanning option leaves them out too.
        if (!context.OmitSuppressed && result.BaselineFile is { } baselineFile)
        {
            foreach (var absent in result.Absent)
            {
                results.Add(Absent(absent, baselineFile, ruleIndex.TryGetValue(absent.RuleId, out var index) ? index : -1));
            }
        }

        var run = new Run
        {
            Tool = new Tool
            {
                Driver = new ToolComponent
                {
                    Name = context.Tool.Name,
                    Version = context.Tool.Version,
                    SemanticVersion = context.Tool.Version,
                    InformationUri = context.Tool.InformationUri,
                    Rules = rules,
                },
            },
            Invocations = [Invocation(result, context)],
            OriginalUriBaseIds = new Dictionary<string, ArtifactLocation>(StringComparer.Ordinal)
            {
                [SarifReporter.SourceRootBaseId] = new ArtifactLocation
                {
                    Uri = new Uri(ReportPaths.DirectoryFileUri(result.RepositoryRoot), UriKind.Absolute),
                },
            },
            Results = results,
            ColumnKind = ColumnKind.Utf16CodeUnits,
        };

        return new SarifLog
        {
            SchemaUri = new Uri(SarifReporter.SchemaUri, UriKind.Absolute),
            Version = SarifVersion.Current,
            Runs = [run],
        };
    }

    private static ReportingDescriptor Rule(RuleDescriptor rule, ToolInfo tool)
    {
        var descriptor = new ReportingDescriptor
        {
            Id = rule.Id,
            Name = rule.Name,
            ShortDescription = new MultiformatMessageString { Text = rule.Title },
            FullDescription = new MultiformatMessageString { Text = rule.Summary },
            Help = new MultiformatMessageString { Text = rule.HelpText, Markdown = rule.HelpMarkdown },
            HelpUri = tool.HelpUri(rule),
            DefaultConfiguration = new ReportingConfiguration { Level = FailureLevelOf(rule.DefaultLevel) },
        };
        if (!rule.Tags.IsDefaultOrEmpty) descriptor.SetProperty("tags", rule.Tags.ToArray());
        return descriptor;
    }

    private static Result Result(Finding finding, int ruleIndex)
    {
        var sarif = new Result
        {
            RuleId = finding.RuleId,
            RuleIndex = ruleIndex,
            Level = FailureLevelOf(finding.Level),
            Message = new Message { Text = finding.Message },
            Locations = [Location(finding.File, finding.Span)],
            PartialFingerprints = new Dictionary<string, string>(StringComparer.Ordinal)
            {
                [Fingerprints.Key] = finding.Fingerprint,
            },
        };
        if (finding.Suppression is { } suppression)
        {
            sarif.Suppressions =
            [
                new SarifSuppression
                {
                    Kind = SuppressionKind.InSource,
                    Justification = suppression.Justification,
                    Location = Location(suppression.File, suppression.Span),
                },
            ];
        }

        if (finding.BaselineState is { } state)
        {
            sarif.BaselineState = state == Core.Findings.BaselineState.Unchanged ? SarifBaselineState.Unchanged : SarifBaselineState.New;
        }

        if (finding.Fix is { } fix)
        {
            sarif.Fixes =
            [
                new Fix
                {
                    Description = new Message { Text = "Set " + fix.Inserted + ": " + fix.Shown + ", a value every rule on this setting accepts." },
                    ArtifactChanges =
                    [
                        new ArtifactChange
                        {
                            ArtifactLocation = ArtifactLocation(finding.File),
                            Replacements =
                            [
                                new Replacement
                                {
                                    DeletedRegion = new Region { StartLine = fix.Region.StartLine, StartColumn = fix.Region.StartColumn, EndLine = fix.Region.EndLine, EndColumn = fix.Region.EndColumn },
                                    InsertedContent = new ArtifactContent { Text = fix.Inserted },
                                },
                            ],
                        },
                    ],
                },
            ];
        }

        // The property bag keeps insertion order: keyPath and messageId first, then the values in their (ordinal) order.
        sarif.SetProperty("keyPath", finding.KeyPath);
        sarif.SetProperty("messageId", finding.MessageId);
        foreach (var (name, value) in finding.Values)
        {
            var key = PropertyName(name);
            if (value.Number is { } number && double.IsFinite(number)) sarif.SetProperty(key, number);
            else sarif.SetProperty(key, value.Text);
        }
        var units = new SortedDictionary<string, string>(StringComparer.Ordinal);
        foreach (var (name, value) in finding.Values)
        {
            if (value.Unit is { } unit && value.Number is { } number && double.IsFinite(number)) units[name] = unit;
        }
        if (units.Count > 0) sarif.SetProperty(UnitsProperty, units);
        return sarif;
    }

    // SARIF 2.1.0 3.27.24: a result of the baseline that this run no longer finds. It is placed on its baseline
    // entry, the line to delete, with the setting file as a related location.
    private static Result Absent(AbsentResult absent, string baselineFile, int ruleIndex)
    {
        var where = absent.KeyPath.Length == 0 ? absent.File : absent.File + " " + absent.KeyPath;
        var text = "In the baseline but no longer found: " + absent.RuleId + " at " + where
            + (absent.Message.Length > 0 ? " (" + absent.Message + ")" : "") + "; remove this entry from the baseline.";
        var sarif = new Result
        {
            RuleId = absent.RuleId,
            RuleIndex = ruleIndex,
            Kind = ResultKind.Informational,
            Level = FailureLevel.None,
            Message = new Message { Text = text },
            // A baseline outside the repository has no URI under the root: the setting file stands in.
            Locations = [Path.IsPathRooted(baselineFile)
                ? new Location { PhysicalLocation = new PhysicalLocation { ArtifactLocation = ArtifactLocation(absent.File) } }
                : Location(baselineFile, Core.Documents.SourceSpan.At(absent.BaselineLine, 1))],
            RelatedLocations = [new Location { Id = 1, PhysicalLocation = new PhysicalLocation { ArtifactLocation = ArtifactLocation(absent.File) } }],
            PartialFingerprints = new Dictionary<string, string>(StringComparer.Ordinal)
            {
                [Fingerprints.Key] = absent.Fingerprint,
            },
            BaselineState = SarifBaselineState.Absent,
        };
        sarif.SetProperty("keyPath", absent.KeyPath);
        return sarif;
    }

    // A value may not take the name of our own properties, nor "tags", which SARIF reserves for a string array.
    private static string PropertyName(string valueName) =>
        valueName is "keyPath" or "messageId" or UnitsProperty or "tags" ? "value." + valueName : valueName;

    private static Location Location(string file, Core.Documents.SourceSpan span) => new()
    {
        PhysicalLocation = new PhysicalLocation
        {
            ArtifactLocation = ArtifactLocation(file),
            Region = Region(span),
        },
    };

    private static ArtifactLocation ArtifactLocation(string file) => new()
    {
        Uri = new Uri(ReportPaths.UriReference(file), UriKind.Relative),
        UriBaseId = SarifReporter.SourceRootBaseId,
    };

    // SARIF wants 1-based lines and columns and an end that is not before the start.
    private static Region Region(Core.Documents.SourceSpan span)
    {
        var startLine = Math.Max(1, span.StartLine);
        var startColumn = Math.Max(1, span.StartColumn);
        var endLine = Math.Max(startLine, span.EndLine);
        var endColumn = Math.Max(1, span.EndColumn);
        if (endLine == startLine && endColumn < startColumn) endColumn = startColumn;
        return new Region { StartLine = startLine, StartColumn = startColumn, EndLine = endLine, EndColumn = endColumn };
    }

    private static Invocation Invocation(CheckResult result, ReportContext context)
    {
        var execution = new List<SarifNotification>();
        var configuration = new List<SarifNotification>();
        foreach (var notification in result.Notifications)
        {
            var sarif = new SarifNotification
            {
                Level = FailureLevel.Error,
                Message = new Message { Text = notification.Message },
            };
            if (notification.File is { } file)
            {
                sarif.Locations =
                [
                    new Location
                    {
                        PhysicalLocation = new PhysicalLocation
                        {
                            ArtifactLocation = ArtifactLocation(file),
                            Region = notification.Span is { } span ? Region(span) : null,
                        },
                    },
                ];
            }
            if (notification.Kind == NotificationKind.Internal)
            {
                if (notification.Exception is { } exception)
                {
                    sarif.Exception = new ExceptionData { Kind = SarifReporter.ExceptionKind(exception), Message = exception };
                }
                execution.Add(sarif);
            }
            else
            {
                configuration.Add(sarif);
            }
        }

        // Rules not evaluated for missing data: notes after the internal errors, each with its rule and missing paths.
        var ruleIndex = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < result.Rules.Length; i++) ruleIndex.TryAdd(result.Rules[i].Id, i);
        foreach (var notRun in result.NotRun)
        {
            var note = new SarifNotification
            {
                Level = FailureLevel.Note,
                Message = new Message { Text = notRun.Sentence },
                Locations = [new Location { PhysicalLocation = new PhysicalLocation { ArtifactLocation = ArtifactLocation(notRun.File) } }],
                AssociatedRule = new ReportingDescriptorReference { Id = notRun.RuleId, Index = ruleIndex.TryGetValue(notRun.RuleId, out var index) ? index : -1 },
            };
            note.SetProperty("missingKeyPaths", notRun.MissingPaths.ToList());
            execution.Add(note);
        }

        var invocation = new Invocation
        {
            ExecutionSuccessful = result.Notifications.All(static n => n.Kind != NotificationKind.Internal),
            ExitCode = result.ExitCode,
            ToolExecutionNotifications = execution.Count > 0 ? execution : null,
            ToolConfigurationNotifications = configuration.Count > 0 ? configuration : null,
        };
        if (context.Timestamps)
        {
            if (context.StartTimeUtc is { } start) invocation.StartTimeUtc = start.UtcDateTime;
            if (context.EndTimeUtc is { } end) invocation.EndTimeUtc = end.UtcDateTime;
        }
        return invocation;
    }

    private static FailureLevel FailureLevelOf(Level level) => level switch
    {
        Level.Error => FailureLevel.Error,
        Level.Warning => FailureLevel.Warning,
        Level.Note => FailureLevel.Note,
        _ => FailureLevel.None,
    };

    /// <summary>
    /// Makes Newtonsoft write properties that Sarif.Sdk leaves out when they equal SARIF's default
    /// (a "warning" level, a rule's default configuration, exit code 0): consumers and code scanning services should not have to know the defaults.
    /// </summary>
    private sealed class ExplicitDefaultsContractResolver : DefaultContractResolver
    {
        protected override JsonProperty CreateProperty(MemberInfo member, MemberSerialization memberSerialization)
        {
            var property = base.CreateProperty(member, memberSerialization);
            if (AlwaysWritten(member.DeclaringType, property.PropertyName))
            {
                property.DefaultValueHandling = DefaultValueHandling.Include;
                property.ShouldSerialize = null;
            }
            return property;
        }

        private static bool AlwaysWritten(Type? type, string? name) => (type?.Name, name) switch
        {
            (nameof(Result), "level") => true,
            (nameof(ReportingDescriptor), "defaultConfiguration") => true,
            (nameof(ReportingConfiguration), "level") => true,
            (nameof(Microsoft.CodeAnalysis.Sarif.Notification), "level") => true,
            (nameof(Invocation), "exitCode") => true,
            (nameof(Run), "columnKind") => true,
            _ => false,
        };
    }
}
