using System.Collections.Immutable;

namespace SettingLint.Core.Findings;

/// <summary>The SL0xx rules: checks of the file itself, built into the engine rather than written as expressions.</summary>
public static class EngineRules
{
    public const string Syntax = "SL001";
    public const string DuplicateKey = "SL002";
    public const string UnknownKey = "SL003";
    public const string MissingKey = "SL004";
    public const string WrongType = "SL005";
    public const string Unit = "SL006";
    public const string Reference = "SL007";
    public const string Limit = "SL008";
    public const string KindOrFormat = "SL009";
    public const string Suppression = "SL010";
    public const string GateChange = "SL011";
    public const string DuplicateTag = "SL012";
    public const string SecondDocument = "SL013";
    public const string KeyNotPlain = "SL014";
    public const string NotAMapping = "SL015";
    public const string NoCompliantValue = "SL020";

    private static readonly ImmutableArray<string> FileTags = ["file"];

    /// <summary>All engine rules, sorted by id.</summary>
    public static ImmutableArray<RuleDescriptor> All { get; } =
    [
        Make(Syntax, "YamlSyntaxError", "The file is not valid YAML.",
            "A .yaml or .yml file that cannot be parsed, or that is not valid UTF-8, is reported at the parser's line and column rather than skipped.",
            "A setting file that does not parse cannot be checked, and other tools may read it differently. Fix the syntax at the position given."),
        Make(DuplicateKey, "DuplicateKey", "A key appears twice in one mapping.",
            "Both positions are given; most YAML tools keep the second value silently, so the setting that is reviewed may not be the one applied.",
            "Remove one of the two entries. Which one applies depends on the tool that reads the file, so the reviewer cannot know what the relay gets."),
        Make(UnknownKey, "UnknownKey", "A key is not part of the setting-file format.",
            "Unknown keys are usually misspellings of a known key; the nearest known key is suggested.",
            "A misspelt key is silently ignored by every check, so a setting that was meant to be checked is not. Correct the spelling or remove the key."),
        Make(MissingKey, "MissingKey", "A required key is missing.",
            "The format makes some keys mandatory because the checks cannot be made without them.",
            "Add the key with the value from the nameplate, datasheet or relay settings."),
        Make(WrongType, "WrongValue", "A value has the wrong type or lies outside its domain.",
            "A value must be of the type the format gives it (number, text, true/false, one of a list) and within its domain (no negative times, no zero ratios).",
            "Correct the value; the message says what is accepted. Until version 0.1 this id also covered a reused tag (now SL012), a second YAML document (SL013), a key that is not a plain word (SL014) and a configuration or rule file that is not a mapping (SL015); those meanings are retired from SL005."),
        Make(Unit, "UnitProblem", "A unit is missing, unknown, of the wrong dimension, or does not say primary or secondary.",
            "Every dimensioned value is a number, a space and a unit. In the protection settings a current or voltage must say which side of its transformer it is on (`A pri`, `A sec`) or be a multiple (`xFLC`, `xCT`, `%`).",
            "A secondary value read as primary (or the reverse) is one of the commonest setting errors: the number is off by the CT or VT ratio. Write the unit the relay setting actually uses."),
        Make(Reference, "BadReference", "A referenced file is missing, of the wrong kind, or outside the repository.",
            "`bus` and `relay_model` name files relative to the setting file; they must exist inside the repository and be of the expected kind.",
            "Without its bus or relay model a motor cannot be checked against its supply or its relay. Correct the path."),
        Make(Limit, "InputLimit", "The input exceeds a safety limit of the loader.",
            "Limits: file size 4 MiB, 100,000 nodes, alias expansion 10,000 nodes, nesting depth 64. They keep a hostile or broken file from stopping the run.",
            "A real setting file is far below these limits; the file is probably generated wrongly or not a setting file."),
        Make(KindOrFormat, "UnknownKindOrFormat", "The file's kind or format version is not known.",
            "`kind` must be motor-protection, bus or relay-model; `format` must be 1.",
            "A file of an unknown kind or a newer format cannot be checked by this version; correct it or upgrade the tool."),
        Make(Suppression, "BadSuppression", "A suppression has no reason, names an unknown rule, or matches no finding.",
            "Accepting a finding in the source needs a reason a reviewer can judge; a suppression that no longer matches anything is stale and should be removed.",
            "Give the reason after the rule ids and a colon (`# settinglint-accept SL110: reviewed in the protection study`), correct the rule id, or remove the stale suppression."),
        Make(GateChange, "GateWeakened", "A change loosens the gate: a rule off, a lower severity, a changed parameter or threshold, a new acceptance or a larger baseline.",
            "With --changed-since, the configuration, rule files, baseline and in-source acceptances are compared with the revision; each change that can let a finding through is reported at its line.",
            "The finding is for the reviewer of the change: confirm that the loosening is intended and justified. It never fails the run by itself, since the change it describes is the one under review; protect the configuration and the baseline with your code-review rules.",
            "the gate's own configuration (built into the engine)", Level.Warning, ["gate"]),
        Make(DuplicateTag, "DuplicateTag", "A tag is already used by another file of the repository.",
            "A tag names one piece of equipment: every file after the first (in path order) that reuses a tag is reported at its tag, with the file that has it first.",
            "Two motors with one tag make the reviewer, the report and the rules over a bus mix them up. Give each piece of equipment its own tag."),
        Make(SecondDocument, "SecondDocument", "A setting file holds more than one YAML document.",
            "A `---` line after the first document starts a second one; only the first is read, so the rest would be ignored silently. The rest must still parse.",
            "Move the second document into a file of its own, or remove the `---` line."),
        Make(KeyNotPlain, "KeyNotPlain", "A key is not a plain word.",
            "A mapping key must be a scalar (such as `pickup`); a sequence or mapping used as a key (`? [a, b]`) has no key path, and its value is not read.",
            "Write the key as a plain word of the format."),
        Make(NotAMapping, "NotAMapping", "A configuration or rule file is not a mapping of keys.",
            "`.settinglint.yaml` and every `rule.yaml` are mappings of keys at the top; a list or a plain value there cannot be read, so the run stops (exit 2).",
            "Write the file as keys and values, as the schema of the configuration (schema/config.schema.json) or of a rule (schema/rule.schema.json) gives them."),
        Make(NoCompliantValue, "NoCompliantValue", "No value of a setting satisfies every rule on it.",
            "The rules that bound one setting leave an empty window: the highest lower bound lies above the lowest upper bound (for example an acceleration timer that must exceed 1.1 x a 10 s start and stay below a 10.5 s hot stall time). The finding names the two rules and their bounds.",
            "No setting clears the findings: the motor data or the protection scheme must change (a speed switch or another stall detection, another CT, another starter), or the data is wrong. Check the data first.",
            "the rules on the setting (derived from their own comparisons)", Level.Warning, ["fix"]),
    ];

    /// <summary>
    /// Meanings an id no longer has, with the id that reports it now. Ids are never reused; what an id meant stays
    /// documented (rules/README.md), so that an old baseline or acceptance can be read.
    /// </summary>
    public static ImmutableArray<(string Id, string Meaning, string Now)> RetiredMeanings { get; } =
    [
        (WrongType, "a tag reused by a later file", DuplicateTag),
        (WrongType, "a second YAML document in a setting file", SecondDocument),
        (WrongType, "a key that is not a plain word", KeyNotPlain),
        (WrongType, "a configuration or rule file that is not a mapping", NotAMapping),
    ];

    /// <summary>The engine rule of an id; throws for a non-engine id (a programming error).</summary>
    public static RuleDescriptor Get(string id) => All.First(r => r.Id == id);

    private static RuleDescriptor Make(string id, string name, string title, string summary, string help,
        string basis = "the setting-file format (contract version 1)", Level level = Level.Error, ImmutableArray<string> tags = default) =>
        new(id, name, title, summary, "**" + title + "**\n\n" + summary + "\n\n" + help + "\n\nBasis: " + basis + ".", level, tags.IsDefault ? FileTags : tags);
}
