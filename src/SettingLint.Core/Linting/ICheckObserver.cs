using SettingLint.Core.Fixes;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Linting;

/// <summary>
/// Listens to one check for what reports need beyond findings: each motor as bound (for plots and hovers) and every
/// rule outcome, passing or not, with its numbers (margins) and bounds (setting windows). Calls come from several
/// threads at once and in no fixed order; an observer that keeps them must take concurrent calls and sort.
/// </summary>
public interface ICheckObserver
{
    /// <summary>A motor with its whole document, bus and relay model, before its rules run.</summary>
    void OnMotor(MotorProtection motor)
    {
    }

    /// <summary>One rule's outcome on one motor and subject.</summary>
    void OnOutcome(RuleOutcome outcome)
    {
    }

    /// <summary>The fixes the run worked out, once, after the gate (only when the request asked for suggestions).</summary>
    void OnFixes(SuggestionSet fixes)
    {
    }
}
