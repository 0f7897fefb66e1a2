using Patchproof.Core.Circuits;

namespace Patchproof.Core.Tests.Circuits;

public sealed class ValueNotationTests
{
    [Theory]
    [InlineData("100k", 100e3)]
    [InlineData("4k7", 4.7e3)]
    [InlineData("1M", 1e6)]
    [InlineData("1 Meg", 1e6)]
    [InlineData("10 kΩ", 10e3)]
    [InlineData("100 kohm", 100e3)]
    [InlineData("470R", 470)]
    [InlineData("4R7", 4.7)]
    [InlineData("2.2MΩ", 2.2e6)]
    [InlineData("1e5", 1e5)]
    [InlineData("3.57k", 3.57e3)]
    public void TryParse_Resistances_AsWritten(string text, double expected)
    {
        Assert.True(ValueNotation.TryParse(text, Quantity.Resistance, out var value, out var error), error);
        Assert.Equal(expected, value, expected * 1e-15);
    }

    [Theory]
    [InlineData("10n", 10e-9)]
    [InlineData("4.7 µF", 4.7e-6)]
    [InlineData("4.7 μF", 4.7e-6)]
    [InlineData("4.7uF", 4.7e-6)]
    [InlineData("2000 pF", 2000e-12)]
    [InlineData("0.47 µF", 0.47e-6)]
    [InlineData("2n2", 2.2e-9)]
    [InlineData("470nF", 470e-9)]
    [InlineData("1e-8 F", 1e-8)]
    public void TryParse_Capacitances_AsWritten(string text, double expected)
    {
        Assert.True(ValueNotation.TryParse(text, Quantity.Capacitance, out var value, out var error), error);
        Assert.Equal(expected, value, expected * 1e-15);
    }

    [Theory]
    [InlineData("1 ms", Quantity.Time, 1e-3)]
    [InlineData("47ms", Quantity.Time, 47e-3)]
    [InlineData("-10V", Quantity.Voltage, -10)]
    [InlineData("400 mV", Quantity.Voltage, 0.4)]
    [InlineData("1", Quantity.Voltage, 1)]
    [InlineData("0.1 /V", Quantity.PerVolt, 0.1)]
    [InlineData("0.1/V", Quantity.PerVolt, 0.1)]
    [InlineData("5 %", Quantity.Fraction, 0.05)]
    [InlineData("-4%", Quantity.Fraction, -0.04)]
    [InlineData("0.4 V", Quantity.VoltsPerUnit, 0.4)]
    [InlineData("80 nA", Quantity.Current, 80e-9)]
    public void TryParse_OtherQuantities_AsWritten(string text, Quantity quantity, double expected)
    {
        Assert.True(ValueNotation.TryParse(text, quantity, out var value, out var error), error);
        Assert.Equal(expected, value, Math.Abs(expected) * 1e-15);
    }

    [Theory]
    [InlineData("10", Quantity.Capacitance, "needs a unit")]
    [InlineData("1", Quantity.Time, "needs a unit")]
    [InlineData("1m", Quantity.Resistance, "ambiguous")]
    [InlineData("ten k", Quantity.Resistance, "does not start with a number")]
    [InlineData("10 kV", Quantity.Capacitance, "unknown unit")]
    [InlineData("", Quantity.Resistance, "empty")]
    [InlineData("4k7x", Quantity.Resistance, "unexpected")]
    public void TryParse_BadText_SaysWhatIsWrong(string text, Quantity quantity, string expected)
    {
        Assert.False(ValueNotation.TryParse(text, quantity, out _, out var error));
        Assert.Contains(expected, error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(10e3, Quantity.Resistance, "10 kΩ")]
    [InlineData(3570, Quantity.Resistance, "3.57 kΩ")]
    [InlineData(10e-9, Quantity.Capacitance, "10 nF")]
    [InlineData(470e-9, Quantity.Capacitance, "470 nF")]
    [InlineData(4.7e-6, Quantity.Capacitance, "4.7 µF")]
    [InlineData(1e-3, Quantity.Time, "1 ms")]
    [InlineData(1e6, Quantity.Resistance, "1 MΩ")]
    public void Format_ReadsBackToTheSameValue(double value, Quantity quantity, string expected)
    {
        var text = ValueNotation.Format(value, quantity);

        Assert.Equal(expected, text);
        Assert.Equal(value, ValueNotation.Parse(text, quantity), value * 1e-12);
    }
}
