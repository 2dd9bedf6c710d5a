namespace SettingLint.Protection;

/// <summary>NEMA MG 1 locked-rotor kVA code letter (NEMA MG 1 Table 10-1); I, O and Q are not used.</summary>
public enum LockedRotorCodeLetter
{
    /// <summary>0 to under 3.15 kVA/hp.</summary>
    A,

    /// <summary>3.15 to under 3.55 kVA/hp.</summary>
    B,

    /// <summary>3.55 to under 4.0 kVA/hp.</summary>
    C,

    /// <summary>4.0 to under 4.5 kVA/hp.</summary>
    D,

    /// <summary>4.5 to under 5.0 kVA/hp.</summary>
    E,

    /// <summary>5.0 to under 5.6 kVA/hp.</summary>
    F,

    /// <summary>5.6 to under 6.3 kVA/hp.</summary>
    G,

    /// <summary>6.3 to under 7.1 kVA/hp.</summary>
    H,

    /// <summary>7.1 to under 8.0 kVA/hp.</summary>
    J,

    /// <summary>8.0 to under 9.0 kVA/hp.</summary>
    K,

    /// <summary>9.0 to under 10.0 kVA/hp.</summary>
    L,

    /// <summary>10.0 to under 11.2 kVA/hp.</summary>
    M,

    /// <summary>11.2 to under 12.5 kVA/hp.</summary>
    N,

    /// <summary>12.5 to under 14.0 kVA/hp.</summary>
    P,

    /// <summary>14.0 to under 16.0 kVA/hp.</summary>
    R,

    /// <summary>16.0 to under 18.0 kVA/hp.</summary>
    S,

    /// <summary>18.0 to under 20.0 kVA/hp.</summary>
    T,

    /// <summary>20.0 to under 22.4 kVA/hp.</summary>
    U,

    /// <summary>22.4 kVA/hp and up.</summary>
    V,
}
