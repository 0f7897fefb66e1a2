using System.Globalization;
using System.Text.RegularExpressions;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Estimation;

/// <summary>One certified parameter of a NIST StRD dataset (NIST ITL Statistical Reference Datasets).</summary>
internal sealed record NistParameter(double Start1, double Start2, double Certified, double CertifiedStandardDeviation);

/// <summary>A NIST StRD dataset parsed from its .dat file: data, certified values, starting values and difficulty.</summary>
/// <remarks>Source: NIST ITL Statistical Reference Datasets, https://www.itl.nist.gov/div898/strd/ (files in
/// tests/ReferenceData/nist-strd, provenance in SOURCES.md). Line ranges come from each file's own header.</remarks>
internal sealed partial record NistStrdDataset(
    string Name,
    string Difficulty,
    IReadOnlyList<NistParameter> Parameters,
    double[][] Rows,
    double CertifiedResidualSumOfSquares,
    double CertifiedResidualStandardDeviation)
{
    public int ObservationCount => Rows.Length;

    public double Response(int row) => Rows[row][0];

    public double Predictor(int row, int which = 0) => Rows[row][1 + which];

    public static NistStrdDataset Load(string name)
    {
        var lines = File.ReadAllLines(ReferenceDataFiles.PathOf($"nist-strd/{name}.dat")).Select(line => line.TrimEnd('\r')).ToArray();
        var header = string.Join('\n', lines.Take(10));
        var dataRange = RangeRegex().Match(header);
        var (first, last) = (int.Parse(dataRange.Groups[1].Value, CultureInfo.InvariantCulture), int.Parse(dataRange.Groups[2].Value, CultureInfo.InvariantCulture));
        var rows = lines[(first - 1)..last]
            .Where(line => line.Trim().Length > 0)
            .Select(line => line.Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(Number).ToArray())
            .ToArray();

        var difficulty = lines.Select(line => DifficultyRegex().Match(line)).First(match => match.Success).Groups[1].Value;
        var parameters = new List<NistParameter>();
        double rss = double.NaN, residualSd = double.NaN;
        for (var i = 0; i < first - 1; i++)
        {
            var nonlinear = NonlinearParameterRegex().Match(lines[i]);
            if (nonlinear.Success)
            {
                parameters.Add(new NistParameter(Number(nonlinear.Groups[1].Value), Number(nonlinear.Groups[2].Value), Number(nonlinear.Groups[3].Value), Number(nonlinear.Groups[4].Value)));
                continue;
            }

            var linear = LinearParameterRegex().Match(lines[i]);
            if (linear.Success)
            {
                parameters.Add(new NistParameter(double.NaN, double.NaN, Number(linear.Groups[1].Value), Number(linear.Groups[2].Value)));
                continue;
            }

            var sum = RssRegex().Match(lines[i]);
            if (sum.Success)
            {
                rss = Number(sum.Groups[1].Value);
            }

            var sd = ResidualSdRegex().Match(lines[i]);
            if (sd.Success)
            {
                residualSd = Number(sd.Groups[1].Value);
            }
        }

        return new NistStrdDataset(name, difficulty, parameters, rows, rss, residualSd);
    }

    /// <summary>The log relative error -log10(|estimate - certified| / |certified|), capped at <paramref name="digits"/>; the absolute form when the certified value is 0.</summary>
    public static double LogRelativeError(double estimate, double certified, double digits = 11)
    {
        var error = certified == 0 ? Math.Abs(estimate) : Math.Abs(estimate - certified) / Math.Abs(certified);
        return error == 0 ? digits : Math.Min(digits, -Math.Log10(error));
    }

    private static double Number(string text) => double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);

    [GeneratedRegex(@"Data\s+\(lines\s+(\d+)\s+to\s+(\d+)\)")]
    private static partial Regex RangeRegex();

    [GeneratedRegex(@"(Lower|Average|Higher) Level of Difficulty")]
    private static partial Regex DifficultyRegex();

    [GeneratedRegex(@"^\s*b\d+\s*=\s*(\S+)\s+(\S+)\s+(\S+)\s+(\S+)\s*$")]
    private static partial Regex NonlinearParameterRegex();

    [GeneratedRegex(@"^\s*B\d+\s+(\S+)\s+(\S+)\s*$")]
    private static partial Regex LinearParameterRegex();

    [GeneratedRegex(@"Residual Sum of Squares:\s+(\S+)")]
    private static partial Regex RssRegex();

    [GeneratedRegex(@"^\s*(?:Residual Standard Deviation:|Standard Deviation)\s+(\S+)")]
    private static partial Regex ResidualSdRegex();
}
