using System.Security.Cryptography;
using System.Text;

namespace SettingLint.Core.Findings;

/// <summary>The stable fingerprint of a finding: a hash of file, rule and key path, never of line numbers.</summary>
public static class Fingerprints
{
    /// <summary>The SARIF partialFingerprints key under which ours is written.</summary>
    public const string Key = "settingPath/v1";

    /// <summary>The fingerprint of a finding at a key path of a file.</summary>
    public static string Of(string file, string ruleId, string keyPath)
    {
        var bytes = SHA256.HashData(Encoding.UTF8.GetBytes(file + "\n" + ruleId + "\n" + keyPath));
        return Convert.ToHexStringLower(bytes.AsSpan(0, 16));
    }
}
