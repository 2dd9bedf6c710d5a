using System.Reflection;
using Microsoft.CodeAnalysis.Sarif;
using Newtonsoft.Json;
using Newtonsoft.Json.Serialization;

namespace SettingLint.Reporting;

/// <summary>
/// Makes Newtonsoft write properties that Sarif.Sdk leaves out when they equal SARIF's default
/// (a "warning" level, a rule's default configuration, exit code 0): consumers and code scanning services should not have to know the defaults.
/// </summary>
internal sealed class ExplicitDefaultsContractResolver : DefaultContractResolver
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
        (nameof(Notification), "level") => true,
        (nameof(Invocation), "exitCode") => true,
        (nameof(Run), "columnKind") => true,
        _ => false,
    };
}
