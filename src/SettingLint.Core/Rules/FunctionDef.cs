namespace SettingLint.Core.Rules;

/// <summary>
/// One function of the closed table, with everything the compiler needs to know about it: its arity, how its result
/// type follows from its arguments, its body, which values it is defined for, and how its result is shown. The compiler
/// reads these and never a function's name, so that adding a function is adding one definition.
/// </summary>
/// <param name="Name">As written in rules.</param>
/// <param name="MinArgs">Fewest arguments.</param>
/// <param name="MaxArgs">Most arguments (int.MaxValue for variadic).</param>
/// <param name="Type">Checks argument types and gives the result type, or throws ArgumentException with the problem.</param>
/// <param name="Body">
/// Computes the result from the evaluated arguments (absent arguments make the result absent unless <see cref="TakesAbsent"/>);
/// for a function over the other motors of the bus, from the present values of its expression for each of them.
/// </param>
public sealed record FunctionDef(string Name, int MinArgs, int MaxArgs, Func<ExprType[], ExprType> Type, FunctionBody Body)
{
    /// <summary>The call as the rule language reference writes it, with argument names ("lrc_at(lrc, from_voltage, to_voltage)").</summary>
    public string Signature { get; init; } = Name + "(...)";

    /// <summary>The result, for the reference table ("current", "bool", "as args").</summary>
    public string Result { get; init; } = "";

    /// <summary>What the function gives, for the reference table, with its source.</summary>
    public string Meaning { get; init; } = "";

    /// <summary>The body is called with absent arguments too (coalesce, present, the functions with optional arguments).</summary>
    public bool TakesAbsent { get; init; }

    /// <summary>
    /// For a function that takes absent arguments: the positions (from 0) of the arguments whose absence alone never
    /// makes the result absent (hot_level's full-load level), so that a missing optional key is not reported as the
    /// reason a rule was not run.
    /// </summary>
    public int[]? OptionalArgs { get; init; }

    /// <summary>Whether the result is a fraction shown in percent.</summary>
    public PercentRule Percent { get; init; }

    /// <summary>The one argument must be a key path as written, not an expression (present).</summary>
    public bool TakesPath { get; init; }

    /// <summary>
    /// The function reads the other motors on the motor's bus: its one argument (if any) is evaluated for each of them,
    /// with the paths and parameters of the rule but not its lets, and the body folds the present values.
    /// </summary>
    public bool OverOtherMotors { get; init; }

    /// <summary>
    /// The numbers each argument must be (by position; missing positions take any value). A present argument outside
    /// its domain makes the result absent without calling the body: such data (a zero time constant) is a fault the
    /// file checks report, not a reason for the function to fail. An exception from the body is therefore a defect of
    /// the tool, reported as such.
    /// </summary>
    public ArgDomain[] Domain { get; init; } = [];

    /// <summary>The argument names of <see cref="Signature"/>, by position ("a", "b", "..." for a variadic one).</summary>
    public IReadOnlyList<string> ArgumentNames
    {
        get
        {
            var open = Signature.IndexOf('(', StringComparison.Ordinal);
            var inner = Signature[(open + 1)..^1];
            return inner.Length == 0 ? [] : inner.Split(", ").Select(n => n.TrimEnd('?')).ToArray();
        }
    }

    /// <summary>Whether a present number is inside the domain of the argument at a position.</summary>
    public bool InDomain(int position, double value) => position >= Domain.Length || Domain[position] switch
    {
        ArgDomain.Finite => double.IsFinite(value),
        ArgDomain.NonNegative => double.IsFinite(value) && value >= 0,
        ArgDomain.Positive => double.IsFinite(value) && value > 0,
        _ => true,
    };
}

/// <summary>A function's body over its evaluated arguments (a span, so that a call needs no array).</summary>
public delegate Val FunctionBody(ReadOnlySpan<Val> args);

/// <summary>When a function's result is a fraction best shown in percent.</summary>
public enum PercentRule
{
    /// <summary>Never: the result is a value of its own.</summary>
    Never,

    /// <summary>Always (coverage is a share of a winding).</summary>
    Always,

    /// <summary>When its first argument is (min, max, abs, coalesce, others_max: the result is one of the arguments' values).</summary>
    AsFirstArgument,
}

/// <summary>The numbers an argument of a function is defined for.</summary>
public enum ArgDomain
{
    /// <summary>Any value.</summary>
    Any,

    /// <summary>A finite number.</summary>
    Finite,

    /// <summary>A finite number, zero or more.</summary>
    NonNegative,

    /// <summary>A finite number above zero.</summary>
    Positive,
}
