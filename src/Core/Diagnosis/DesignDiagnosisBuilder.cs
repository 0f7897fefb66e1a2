using Patchproof.Core.Circuits;
using Patchproof.Core.Estimation.MultipleShooting;

namespace Patchproof.Core.Diagnosis;

/// <summary>Turns a board design and a multiple-shooting fit into the rows and columns the part diagnosis explains.</summary>
/// <remarks>
/// <para>Rows: ln(theta_hat/theta_nom) for every design term whose equation and basis states were all recorded
/// (a term touching a hidden state depends on that state's unobservable amplitude), and one offset row per
/// recorded equation, o_j = b_hat_j / S_j in volts with S_j = Σ 1/(R_i C_j) over the integrator's inputs at nominal
/// values: an integrator input offset V_os produces exactly b_j = V_os S_j.</para>
/// <para>Row covariance: from the fit's covariance by the delta method, with floors for what the fit cannot know:
/// 0.1 % on each log-coefficient (a careful whole setup is accurate to about 0.1 %, Howe and Howe 1953) and 0.2 mV
/// on each offset row.</para>
/// <para>Columns: every part by its log-sensitivity on each row (resistor -1, capacitor -1, multiplier +1, inverter
/// feedback +1 and input -1), each integrator's input offset (+1 on its own offset row, or S_j / b_j on the log row of
/// the equation's constant term where the design has one; 5 mV tolerance: common practice for general-purpose op-amps,
/// from memory), each probe gain (+1 on its own equation's rows, -p for each
/// power p of its channel in a term's basis; a calibrated channel's prior is the calibration's, and the calibrated channels then
/// share one more column for the reference probe's own gain error, at the probe tolerance), and the scope's time base.</para>
/// </remarks>
public static class DesignDiagnosisBuilder
{
    /// <summary>The largest input offset of a healthy general-purpose op-amp, in volts (common practice, from memory).</summary>
    public const double OpAmpOffsetToleranceVolts = 0.005;

    private const double LogCoefficientFloor = 1e-3;
    private const double OffsetFloorVolts = 2e-4;

    /// <summary>Builds the diagnosis problem.</summary>
    /// <param name="design">The board as drawn.</param>
    /// <param name="terms">The design's terms, in the field's term order.</param>
    /// <param name="field">The fitted vector field.</param>
    /// <param name="fit">The multiple-shooting result.</param>
    /// <param name="channelOfVariable">The channel name recording each variable; hidden variables are absent.</param>
    /// <param name="gainSdOfChannel">The log-gain prior sd of each channel (about 0.01 uncalibrated, 0.001-0.003 calibrated);
    /// null when the fit estimated the gains itself, so that their uncertainty is already in its covariance.</param>
    /// <param name="calibratedChannels">Channels whose gains a calibration capture measured against one reference: their columns are
    /// marked <see cref="DiagnosisColumn.PinnedByCalibration"/>, and they share one more column, the reference probe's own error.</param>
    /// <param name="commonGainSd">That shared column's log-gain prior sd (the probe tolerance's, or the measured reference gain's).</param>
    /// <param name="commonGainMeasured">True when an absolute calibration measured that shared gain against a known amplitude: its
    /// column is then <see cref="DiagnosisColumn.PinnedByCalibration"/> too, so no gain stays loose.</param>
    /// <returns>The rows, columns and covariance.</returns>
    public static DiagnosisProblem Build(
        BoardDesign design,
        IReadOnlyList<DesignTerm> terms,
        PolynomialVectorField field,
        MultipleShootingResult fit,
        IReadOnlyDictionary<string, string> channelOfVariable,
        IReadOnlyDictionary<string, double>? gainSdOfChannel,
        IReadOnlyCollection<string>? calibratedChannels = null,
        double commonGainSd = 0,
        bool commonGainMeasured = false)
    {
        var variables = design.Variables.Select(v => v.Name).ToList();
        bool Observed(string variable) => channelOfVariable.ContainsKey(variable);
        var rowSources = new List<(DiagnosisRow Row, int Parameter, double Scale)>();
        for (var t = 0; t < terms.Count; t++)
        {
            var term = terms[t];
            if (!Observed(term.Variable) || !term.Basis.Variables.All(Observed) || term.Basis.Function is not null)
            {
                continue;
            }

            var estimate = fit.Parameters[t];
            if (Math.Sign(estimate) != Math.Sign(term.NominalCoefficient) || estimate == 0)
            {
                // A sign flip is a wiring question, not a drift: the structure check speaks to it; keep it out of the log rows.
                continue;
            }

            var label = $"{term.Variable}' term {term.Basis}";
            rowSources.Add((new DiagnosisRow($"{term.Variable}':{term.Basis}", label, DiagnosisRowKind.LogCoefficient, Math.Log(estimate / term.NominalCoefficient)), t, 1 / estimate));
        }

        var inputConductance = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var integrator in design.Integrators)
        {
            var capacitance = design.NominalOf(integrator.CapacitorId);
            inputConductance[integrator.Variable] = integrator.Inputs.Sum(input => 1 / (design.NominalOf(input.ResistorId) * capacitance));
        }

        for (var k = 0; k < field.OffsetEquations.Count; k++)
        {
            var variable = variables[field.OffsetEquations[k]];
            if (!Observed(variable) || !inputConductance.TryGetValue(variable, out var conductance))
            {
                continue;
            }

            var parameter = field.TermCount + k;
            rowSources.Add((new DiagnosisRow($"{variable}':offset", $"{variable} integrator offset", DiagnosisRowKind.OffsetVolts, fit.Parameters[parameter] / conductance), parameter, 1 / conductance));
        }

        var rows = rowSources.Select(source => source.Row).ToList();
        var count = rows.Count;
        var parameterCount = field.ParameterCount;
        var covariance = new double[count, count];
        for (var a = 0; a < count; a++)
        {
            for (var b = 0; b < count; b++)
            {
                var value = fit.Covariance[rowSources[a].Parameter * fit.GlobalNames.Count + rowSources[b].Parameter];
                covariance[a, b] = double.IsFinite(value) ? value * rowSources[a].Scale * rowSources[b].Scale : (a == b ? 1 : 0);
            }

            var floor = rows[a].Kind is DiagnosisRowKind.LogCoefficient ? LogCoefficientFloor : OffsetFloorVolts;
            covariance[a, a] += floor * floor;
        }

        covariance = NearestPositiveDefinite(covariance);
        var columns = new List<DiagnosisColumn>();
        double NominalOf(string id) => design.NominalOf(id);
        foreach (var part in design.Parts)
        {
            var entries = rowSources.Select(source => source.Row.Kind is DiagnosisRowKind.LogCoefficient
                ? terms[source.Parameter].LogSensitivity(part.Id, NominalOf)
                : 0.0).ToArray();
            var (unit, plausible) = part.Kind switch
            {
                PartKind.Resistor => ("Ω", 3.5),
                PartKind.Capacitor => ("F", 3.5),
                PartKind.Multiplier => ("1/V", 1.5),
                _ => ("V", 1.5),
            };
            columns.Add(DiagnosisColumn.ForPartValue(part.Id, DescribePart(design, part), part.NominalValue, unit, part.Tolerance, entries, plausible));
        }

        foreach (var integrator in design.Integrators.Where(i => Observed(i.Variable)))
        {
            // Where the design has a constant term in this equation there is no offset row: the offset adds V_os S_j to
            // that term instead, so it moves ln(b_j) by S_j / b_j per volt.
            var conductance = inputConductance.GetValueOrDefault(integrator.Variable);
            var entries = rowSources.Select(source =>
                source.Row.Id == $"{integrator.Variable}':offset" ? 1.0
                : source.Row.Kind is DiagnosisRowKind.LogCoefficient && terms[source.Parameter] is { Basis.IsConstant: true } constant && constant.Variable == integrator.Variable
                    ? conductance / constant.NominalCoefficient
                    : 0.0).ToArray();
            columns.Add(DiagnosisColumn.ForPartOffset($"{integrator.Variable}-integrator.offset", $"input offset of the {integrator.Variable} integrator's op-amp", OpAmpOffsetToleranceVolts, entries));
        }

        foreach (var (variable, channel) in gainSdOfChannel is null ? new Dictionary<string, string>() : channelOfVariable)
        {
            var entries = rowSources.Select(source =>
            {
                if (source.Row.Kind is not DiagnosisRowKind.LogCoefficient)
                {
                    return 0.0;
                }

                var term = terms[source.Parameter];
                return (term.Variable == variable ? 1.0 : 0.0) - term.Basis.Variables.Count(v => v == variable);
            }).ToArray();
            var sd = gainSdOfChannel!.TryGetValue(channel, out var given) ? given : Math.Log(1.02) / 2;
            columns.Add(DiagnosisColumn.ForChannelGain(channel, Math.Exp(2 * sd) - 1, entries, sd) with { PinnedByCalibration = calibratedChannels?.Contains(channel) == true });
        }

        var pinned = columns.Where(column => column.PinnedByCalibration).ToList();
        if (pinned.Count > 0 && commonGainSd > 0)
        {
            var entries = rows.Select((_, i) => pinned.Sum(column => column.Entries[i])).ToArray();
            columns.Add(DiagnosisColumn.ForChannelGain("common", Math.Exp(2 * commonGainSd) - 1, entries, commonGainSd) with
            {
                Id = DiagnosisColumn.CommonGainId,
                Label = commonGainMeasured
                    ? "the gain every calibrated probe shares (the reference probe's absolute gain, measured against a known amplitude)"
                    : "the gain every calibrated probe shares (the reference probe's own error)",
                PinnedByCalibration = commonGainMeasured,
            });
        }

        columns.Add(DiagnosisColumn.ForTimeBase(rows.Select(row => row.Kind is DiagnosisRowKind.LogCoefficient ? 1.0 : 0.0).ToArray()));
        return new DiagnosisProblem(rows, columns, covariance);
    }

    /// <summary>A short or ill-conditioned fit can give a covariance with tiny negative eigenvalues: clip them, keeping the rest.</summary>
    private static double[,] NearestPositiveDefinite(double[,] covariance)
    {
        var matrix = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DenseOfArray(covariance);
        matrix = 0.5 * (matrix + matrix.Transpose());
        var decomposition = matrix.Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Symmetric);
        var values = decomposition.EigenValues.Select(value => value.Real).ToArray();
        var floor = Math.Max(values.Max(), 1e-300) * 1e-12;
        if (values.All(value => value > floor))
        {
            return matrix.ToArray();
        }

        var clipped = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DiagonalOfDiagonalArray(values.Select(value => Math.Max(value, floor)).ToArray());
        var vectors = decomposition.EigenVectors;
        return (vectors * clipped * vectors.Transpose()).ToArray();
    }

    private static string DescribePart(BoardDesign design, Part part)
    {
        foreach (var integrator in design.Integrators)
        {
            if (integrator.CapacitorId == part.Id)
            {
                return $"capacitor of the {integrator.Variable} integrator";
            }

            var input = integrator.Inputs.FirstOrDefault(i => i.ResistorId == part.Id);
            if (input is not null)
            {
                return $"resistor from {input.From} into the {integrator.Variable} integrator";
            }
        }

        return part.Kind switch
        {
            PartKind.Multiplier => "multiplier " + (design.Blocks.OfType<MultiplierBlock>().FirstOrDefault(m => m.PartId == part.Id)?.Output ?? part.Id),
            PartKind.Resistor => "resistor of an inverter or summer",
            _ => part.Kind.ToString().ToLowerInvariant(),
        };
    }
}
