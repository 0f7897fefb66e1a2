using Patchproof.Core.Diagnosis;

namespace Patchproof.Core.Tests.Diagnosis;

/// <summary>
/// The part paths of a three-integrator Lorenz board, written out by hand from the integrator algebra:
/// each term's coefficient is ±1/(R C) for a direct input and ±kappa/(R C) through a multiplier, so its
/// log-deviation is -u_R - u_C (+ u_M). Rows: x'(y), x'(x), y'(x), y'(y), y'(xz), z'(xy), z'(z).
/// </summary>
internal static class LorenzBoardColumns
{
    public static readonly string[] RowIds = ["x':y", "x':x", "y':x", "y':y", "y':xz", "z':xy", "z':z"];

    public static IReadOnlyList<DiagnosisRow> Rows(double[] values) =>
        RowIds.Select((id, i) => new DiagnosisRow(id, id, DiagnosisRowKind.LogCoefficient, values[i])).ToList();

    /// <summary>R1..R7 1 % resistors, C1..C3 5 % capacitors, M1 (x·z) and M2 (x·y) 3 % multipliers, probe gains 2 %.</summary>
    public static IReadOnlyList<DiagnosisColumn> Columns(bool withGains = false, double gainTolerance = 0.02)
    {
        var columns = new List<DiagnosisColumn>
        {
            Resistor("R1", 0), Resistor("R2", 1), Resistor("R3", 2), Resistor("R4", 3), Resistor("R5", 4), Resistor("R6", 5), Resistor("R7", 6),
            Capacitor("C1", 0, 1), Capacitor("C2", 2, 3, 4), Capacitor("C3", 5, 6),
            DiagnosisColumn.ForPartValue("M1", "multiplier x·z", 0.1, "1/V", 0.03, Unit(4, +1), plausibleFactor: 1.5),
            DiagnosisColumn.ForPartValue("M2", "multiplier x·y", 0.1, "1/V", 0.03, Unit(5, +1), plausibleFactor: 1.5),
        };
        if (withGains)
        {
            // +1 on the equation's own channel, -p for each power p of a channel in the term's monomial.
            columns.Add(DiagnosisColumn.ForChannelGain("CH1", gainTolerance, [1 - 1, 1 - 1, 0 - 1, 0, 0 - 1 - 0, 0 - 1, 0]));
            columns.Add(DiagnosisColumn.ForChannelGain("CH2", gainTolerance, [0 - 1, 0, 1 - 0, 1 - 1, 1, 0 - 1, 0]));
            columns.Add(DiagnosisColumn.ForChannelGain("CH3", gainTolerance, [0, 0, 0, 0, 0 - 1, 1, 1 - 1]));
        }

        return columns;
    }

    public static double[] Effect(IReadOnlyList<DiagnosisColumn> columns, params (string Id, double U)[] deviations)
    {
        var effect = new double[RowIds.Length];
        foreach (var (id, u) in deviations)
        {
            var column = columns.Single(c => c.Id == id);
            for (var i = 0; i < effect.Length; i++)
            {
                effect[i] += column.Entries[i] * u;
            }
        }

        return effect;
    }

    public static double[,] DiagonalCovariance(double sd)
    {
        var covariance = new double[RowIds.Length, RowIds.Length];
        for (var i = 0; i < RowIds.Length; i++)
        {
            covariance[i, i] = sd * sd;
        }

        return covariance;
    }

    private static DiagnosisColumn Resistor(string id, int row) =>
        DiagnosisColumn.ForPartValue(id, $"input resistor of term {RowIds[row]}", 100e3, "Ω", 0.01, Unit(row, -1));

    private static DiagnosisColumn Capacitor(string id, params int[] rows)
    {
        var entries = new double[RowIds.Length];
        foreach (var row in rows)
        {
            entries[row] = -1;
        }

        return DiagnosisColumn.ForPartValue(id, "integrator capacitor", 10e-9, "F", 0.05, entries);
    }

    private static double[] Unit(int row, double value)
    {
        var entries = new double[RowIds.Length];
        entries[row] = value;
        return entries;
    }
}
