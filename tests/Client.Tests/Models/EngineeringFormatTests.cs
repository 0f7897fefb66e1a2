using Patchproof.Client.Models;

namespace Patchproof.Client.Tests.Models;

public sealed class EngineeringFormatTests
{
    [Theory]
    [InlineData(100_000, "Ohm", "100 kOhm")]
    [InlineData(35_700, "Ohm", "35.7 kOhm")]
    [InlineData(10e-9, "F", "10 nF")]
    [InlineData(470e-9, "F", "470 nF")]
    [InlineData(1e-6, "F", "1 µF")]
    [InlineData(0.1, "1/V", "0.1 1/V")]
    [InlineData(0, "V", "0 V")]
    public void Format_PartValues_ReadLikeTheirLabels(double value, string unit, string expected)
    {
        Assert.Equal(expected, EngineeringFormat.Format(value, unit));
    }
}
