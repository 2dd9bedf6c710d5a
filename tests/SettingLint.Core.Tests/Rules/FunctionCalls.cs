using SettingLint.Core.Quantities;
using SettingLint.Core.Rules;

namespace SettingLint.Core.Tests.Rules;

/// <summary>Calls the rule language's functions by name, as the compiled rules do, for the tests that pin them.</summary>
internal static class FunctionCalls
{
    public static readonly Val None = Val.Absent;
    public static readonly ExprType Current = ExprType.Num(Dim.Current);
    public static readonly ExprType Plain = ExprType.Num(Dim.None);
    public static readonly ExprType Ohms = ExprType.Num(Dim.Of(Dimension.Impedance));
    public static readonly ExprType Text = ExprType.Text;

    public static Val Call(string name, params Val[] args) => Functions.All[name].Body(args);

    public static double Number(string name, params Val[] args)
    {
        var v = Call(name, args);
        Assert.Equal(ValKind.Number, v.Kind);
        return v.Number;
    }

    public static Val N(double x) => Val.Of(x);

    public static Val T(string s) => Val.Of(s);

    public static ExprType TypeOf(string name, params ExprType[] args) => Functions.All[name].Type(args);
}
