using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Estimation.MultipleShooting;
using Patchproof.Core.Simulation;
using Patchproof.TestSupport;

namespace Patchproof.Server.Tests.Hosting;

/// <summary>Invented captures of a demo board whose parts may deviate from its design (demo data: simulated from the
/// design's own term algebra with Dormand-Prince, noise of 0.5 % of each channel's SD, 8-bit quantization), as scope CSV.</summary>
internal static class SyntheticBoardCaptures
{
    public static string DesignText(string file) => File.ReadAllText(Path.Combine(ReferenceDataFiles.RepositoryRoot, "designs", file));

    public static BoardDesign Design(string file) => DesignFileReader.Read(DesignText(file), file).Value;

    /// <summary>The board as built with <paramref name="partFactors"/> applied to the named parts, recorded on every variable.</summary>
    public static byte[] Csv(string designFile, IReadOnlyDictionary<string, double> partFactors, int seed, double problemUnits = 20) =>
        Csv(Design(designFile), partFactors, seed, problemUnits);

    /// <summary>The same for a design given as a read design.</summary>
    public static byte[] Csv(BoardDesign design, IReadOnlyDictionary<string, double> partFactors, int seed, double problemUnits = 20)
    {
        var asBuilt = design.WithPartValues(partFactors.ToDictionary(p => p.Key, p => p.Value * design.NominalOf(p.Key)));
        var variables = asBuilt.Variables.Select(v => v.Name).ToList();
        var terms = asBuilt.Terms();
        var field = new PolynomialVectorField(
            variables,
            terms.Select(t => new PolynomialTerm(variables.IndexOf(t.Variable), t.Basis.Variables.Select(v => variables.IndexOf(v)).ToList(), t.Basis.ToString())).ToList(),
            variables.Select(_ => false).ToList());
        var parameters = terms.Select(t => t.NominalCoefficient).ToImmutableArray();
        var tau = asBuilt.TimeScaleSeconds;
        var start = asBuilt.Variables.Select(v => v.ToVolts(1.0)).ToImmutableArray();
        var dt = tau / 500;
        var count = (int)Math.Round(problemUnits * 500) + 1;
        var times = Enumerable.Range(0, count).Select(i => i * dt).ToImmutableArray();
        var run = OdeSolver.Solve(new OdeProblem(field, start, 0, times[^1], parameters),
            new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10, SampleTimes = times });
        var random = new Random(seed);
        var channels = Enumerable.Range(0, variables.Count).Select(j =>
        {
            var clean = Enumerable.Range(0, count).Select(i => run.StateAt(i)[j]).ToArray();
            var mean = clean.Average();
            var sd = Math.Sqrt(clean.Sum(v => (v - mean) * (v - mean)) / count);
            var step = 2 * 1.1 * clean.Max(Math.Abs) / 256;
            return clean.Select(v => Math.Round((v + (0.005 * sd * GaussianNoise.Next(random))) / step) * step).ToArray();
        }).ToList();

        var text = new StringBuilder();
        text.Append("time_s,").Append(string.Join(',', variables.Select((_, j) => $"CH{j + 1}"))).Append('\n');
        for (var i = 0; i < count; i++)
        {
            text.Append((i * dt).ToString("E6", CultureInfo.InvariantCulture));
            foreach (var channel in channels)
            {
                text.Append(',').Append(channel[i].ToString("G6", CultureInfo.InvariantCulture));
            }

            text.Append('\n');
        }

        return Encoding.ASCII.GetBytes(text.ToString());
    }
}
