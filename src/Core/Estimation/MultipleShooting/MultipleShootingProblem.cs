using System.Collections.Immutable;
using MathNet.Numerics.LinearAlgebra;
using Patchproof.Core.Models;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>The multiple-shooting least-squares problem, condensed: segment states are eliminated block by block.</summary>
/// <remarks>
/// Unknowns, in order: the initial state s_k of each of the K segments (K·n), the field's parameters (P_f),
/// the channel offsets (C, when fitted), the channel gains (those with a prior). Residuals: weighted observation
/// misfits (y - g·x - d)/σ, continuity w·(x_k(t_{k+1}) - s_{k+1}) at every join, and gain priors. The Gauss-Newton
/// matrix is block tridiagonal in the s_k with dense coupling to the globals; <see cref="TrySolveDampedStep"/>
/// runs a block Thomas elimination over the segments and solves the globals' Schur complement, so the cost grows
/// linearly with K.
/// </remarks>
internal sealed class MultipleShootingProblem : ILevenbergMarquardtProblem
{
    private readonly IOdeSystem field;
    private readonly IReadOnlyList<ShootingChannel> channels;
    private readonly MultipleShootingOptions options;
    private readonly double startSeconds;
    private readonly double intervalSeconds;
    private readonly int[] boundaries;
    private readonly ImmutableArray<double>[] segmentTimes;
    private readonly int n;
    private readonly int fieldParameters;
    private readonly int offsetCount;
    private readonly int[] gainChannels;
    private readonly double continuityWeight;
    private readonly double[][] huberWeights;
    private readonly double[][] excludedWeights;
    private readonly double[][] samples;

    // The last linearization point and its gradient and curvature diagonal: the uncertainty asks again at the solution.
    private double[] linearizedAt = [];
    private double[] linearizedGradient = [];
    private double[] linearizedCurvature = [];
    private readonly double[][] linearizedResiduals;
    private Matrix<double>[] diagonalBlocks = [];
    private Matrix<double>[] upperBlocks = [];
    private Matrix<double>[] couplingBlocks = [];
    private Matrix<double> globalBlock = Matrix<double>.Build.Dense(1, 1);
    private Vector<double>[] stateGradients = [];
    private Vector<double> globalGradient = Vector<double>.Build.Dense(1);

    public MultipleShootingProblem(IOdeSystem field, IReadOnlyList<ShootingChannel> channels, double startSeconds, double intervalSeconds, MultipleShootingOptions options)
    {
        this.field = field;
        this.channels = channels;
        this.options = options;
        this.startSeconds = startSeconds;
        this.intervalSeconds = intervalSeconds;
        n = field.StateCount;
        fieldParameters = field.ParameterCount;
        offsetCount = options.EstimateChannelOffsets ? channels.Count : 0;
        gainChannels = channels.Select((channel, c) => (channel, c)).Where(pair => pair.channel.GainPriorRelativeSd is not null).Select(pair => pair.c).ToArray();
        var sampleCount = channels[0].Samples.Count;
        var perSegment = Math.Max(4, (int)Math.Round(options.SegmentSeconds / intervalSeconds));
        var cuts = new List<int>();
        for (var i = 0; i < sampleCount - 1; i += perSegment)
        {
            cuts.Add(i);
        }

        if (cuts.Count > 1 && sampleCount - 1 - cuts[^1] < perSegment / 2)
        {
            cuts.RemoveAt(cuts.Count - 1);
        }

        cuts.Add(sampleCount - 1);
        boundaries = cuts.ToArray();
        segmentTimes = Enumerable.Range(0, SegmentCount)
            .Select(k => Enumerable.Range(boundaries[k], boundaries[k + 1] - boundaries[k] + 1).Select(TimeOf).ToImmutableArray())
            .ToArray();
        continuityWeight = options.ContinuityWeightFactor / channels.Min(channel => channel.NoiseSdVolts);
        excludedWeights = channels.Select(channel => channel.Excluded is { } excluded ? excluded.Select(x => x ? 0.0 : 1.0).ToArray() : Enumerable.Repeat(1.0, sampleCount).ToArray()).ToArray();
        huberWeights = excludedWeights.Select(weights => (double[])weights.Clone()).ToArray();
        samples = channels.Select(channel => channel.Samples.ToArray()).ToArray();
        linearizedResiduals = samples.Select(values => new double[values.Length]).ToArray();
    }

    public int SegmentCount => boundaries.Length - 1;

    public int GlobalCount => fieldParameters + offsetCount + gainChannels.Length;

    public int ParameterCount => SegmentCount * n + GlobalCount;

    public IReadOnlyList<int> GainChannels => gainChannels;

    public double SegmentStart(int k) => TimeOf(boundaries[k]);

    public int SegmentFirstSample(int k) => boundaries[k];

    public double TimeOf(int sample) => startSeconds + sample * intervalSeconds;

    public int ObservationCount => channels.Count * channels[0].Samples.Count;

    /// <summary>Observations not excluded (clipped stretches left out).</summary>
    public int UsedObservationCount => excludedWeights.Sum(weights => weights.Count(w => w > 0));

    public bool TryEvaluateCost(ReadOnlySpan<double> parameters, out double sumOfSquares)
    {
        var unknowns = parameters.ToArray();
        var costs = new double[SegmentCount];
        var finite = true;
        ForEachSegment(k =>
        {
            var solution = Integrate(unknowns, k, withSensitivities: false);
            if (solution.Status is not SolveStatus.Succeeded)
            {
                costs[k] = double.NaN;
                return;
            }

            costs[k] = SegmentCost(unknowns, k, solution, residuals: null);
        });
        sumOfSquares = costs.Sum() + GainPriorCost(unknowns);
        finite &= double.IsFinite(sumOfSquares);
        return finite;
    }

    public bool TryLinearize(ReadOnlySpan<double> parameters, Span<double> gradient, Span<double> curvatureDiagonal)
    {
        if (parameters.SequenceEqual(linearizedAt))
        {
            linearizedGradient.CopyTo(gradient);
            linearizedCurvature.CopyTo(curvatureDiagonal);
            return true;
        }

        linearizedAt = [];
        var unknowns = parameters.ToArray();
        var k = SegmentCount;
        var pieces = new SegmentLinearization?[k];
        ForEachSegment(segment => pieces[segment] = LinearizeSegment(unknowns, segment));
        if (pieces.Any(piece => piece is null))
        {
            return false;
        }

        var build = Matrix<double>.Build;
        diagonalBlocks = pieces.Select(piece => piece!.StateBlock.Clone()).ToArray();
        upperBlocks = new Matrix<double>[Math.Max(0, k - 1)];
        couplingBlocks = pieces.Select(piece => piece!.CouplingBlock.Clone()).ToArray();
        stateGradients = pieces.Select(piece => piece!.StateGradient.Clone()).ToArray();
        globalBlock = build.Dense(GlobalCount, GlobalCount);
        globalGradient = Vector<double>.Build.Dense(GlobalCount);
        var w2 = continuityWeight * continuityWeight;
        for (var segment = 0; segment < k; segment++)
        {
            var piece = pieces[segment]!;
            globalBlock += piece.GlobalBlock;
            globalGradient += piece.GlobalGradient;
            if (segment < k - 1)
            {
                // Continuity q = w (x_end - s_next): d/ds_k = w G, d/ds_next = -w I, d/dp = w S.
                var g = piece.EndStateSensitivity;
                var s = piece.EndParameterSensitivity;
                var q = piece.ContinuityMismatch;
                diagonalBlocks[segment] += w2 * g.TransposeThisAndMultiply(g);
                upperBlocks[segment] = -w2 * g.Transpose();
                diagonalBlocks[segment + 1] += w2 * build.DenseIdentity(n);
                stateGradients[segment] += continuityWeight * g.TransposeThisAndMultiply(q);
                stateGradients[segment + 1] -= continuityWeight * q;
                var fieldCoupling = w2 * g.TransposeThisAndMultiply(s);
                couplingBlocks[segment].SetSubMatrix(0, 0, couplingBlocks[segment].SubMatrix(0, n, 0, fieldParameters) + fieldCoupling);
                couplingBlocks[segment + 1].SetSubMatrix(0, 0, couplingBlocks[segment + 1].SubMatrix(0, n, 0, fieldParameters) - w2 * s);
                var fieldBlock = w2 * s.TransposeThisAndMultiply(s);
                globalBlock.SetSubMatrix(0, 0, globalBlock.SubMatrix(0, fieldParameters, 0, fieldParameters) + fieldBlock);
                var fieldGradient = continuityWeight * s.TransposeThisAndMultiply(q);
                for (var p = 0; p < fieldParameters; p++)
                {
                    globalGradient[p] += fieldGradient[p];
                }
            }
        }

        AddGainPriors(unknowns);
        for (var segment = 0; segment < k; segment++)
        {
            for (var i = 0; i < n; i++)
            {
                gradient[segment * n + i] = stateGradients[segment][i];
                curvatureDiagonal[segment * n + i] = diagonalBlocks[segment][i, i];
            }
        }

        var offset = k * n;
        for (var p = 0; p < GlobalCount; p++)
        {
            gradient[offset + p] = globalGradient[p];
            curvatureDiagonal[offset + p] = globalBlock[p, p];
        }

        foreach (var value in gradient)
        {
            if (!double.IsFinite(value))
            {
                return false;
            }
        }

        linearizedAt = unknowns;
        linearizedGradient = gradient.ToArray();
        linearizedCurvature = curvatureDiagonal.ToArray();
        return true;
    }

    public bool TrySolveDampedStep(ReadOnlySpan<double> damping, Span<double> step)
    {
        var k = SegmentCount;
        var offset = k * n;
        var (stateSolutions, gradientSolutions, schur, condensedRhs) = Eliminate(damping);
        if (schur is null)
        {
            return false;
        }

        Vector<double> globalStep;
        try
        {
            globalStep = schur.Cholesky().Solve(condensedRhs);
        }
        catch (ArgumentException)
        {
            return false;
        }

        for (var p = 0; p < GlobalCount; p++)
        {
            step[offset + p] = globalStep[p];
        }

        for (var segment = 0; segment < k; segment++)
        {
            var stateStep = -gradientSolutions![segment] - stateSolutions![segment] * globalStep;
            for (var i = 0; i < n; i++)
            {
                step[segment * n + i] = stateStep[i];
            }
        }

        foreach (var value in step)
        {
            if (!double.IsFinite(value))
            {
                return false;
            }
        }

        return true;
    }

    /// <summary>The undamped condensed curvature of the globals, (C - Bᵀ T⁻¹ B), at the last linearization.</summary>
    public Matrix<double>? CondensedCurvature() => Eliminate(new double[ParameterCount]).Schur;

    /// <summary>Observation residuals (unweighted by Huber, scaled by σ) per channel at <paramref name="unknowns"/>.</summary>
    public double[][] ObservationResiduals(double[] unknowns)
    {
        if (unknowns.AsSpan().SequenceEqual(linearizedAt))
        {
            // The linearization's pass already integrated every segment here and kept its misfits.
            return linearizedResiduals.Select(values => (double[])values.Clone()).ToArray();
        }

        var residuals = channels.Select(channel => new double[channel.Samples.Count]).ToArray();
        ForEachSegment(k =>
        {
            var solution = Integrate(unknowns, k, withSensitivities: false);
            if (solution.Status is SolveStatus.Succeeded)
            {
                SegmentCost(unknowns, k, solution, residuals);
            }
            else
            {
                foreach (var channelResiduals in residuals)
                {
                    Array.Fill(channelResiduals, double.NaN, boundaries[k], boundaries[k + 1] - boundaries[k] + 1);
                }
            }
        });
        return residuals;
    }

    /// <summary>Starting unknowns from segment states and global values.</summary>
    public double[] Pack(IReadOnlyList<IReadOnlyList<double>> segmentStates, IReadOnlyList<double> fieldParameterValues, IReadOnlyList<double> channelOffsets)
    {
        var unknowns = new double[ParameterCount];
        for (var k = 0; k < SegmentCount; k++)
        {
            for (var i = 0; i < n; i++)
            {
                unknowns[k * n + i] = segmentStates[k][i];
            }
        }

        var offset = SegmentCount * n;
        for (var p = 0; p < fieldParameters; p++)
        {
            unknowns[offset + p] = fieldParameterValues[p];
        }

        for (var c = 0; c < offsetCount; c++)
        {
            unknowns[offset + fieldParameters + c] = channelOffsets[c];
        }

        for (var g = 0; g < gainChannels.Length; g++)
        {
            unknowns[offset + fieldParameters + offsetCount + g] = channels[gainChannels[g]].NominalGain;
        }

        return unknowns;
    }

    public double OffsetOf(double[] unknowns, int channel) =>
        offsetCount == 0 ? 0 : unknowns[SegmentCount * n + fieldParameters + channel];

    public double GainOf(double[] unknowns, int channel)
    {
        var slot = Array.IndexOf(gainChannels, channel);
        return slot < 0 ? channels[channel].NominalGain : unknowns[SegmentCount * n + fieldParameters + offsetCount + slot];
    }

    private (Matrix<double>[]? StateSolutions, Vector<double>[]? GradientSolutions, Matrix<double>? Schur, Vector<double> Rhs) Eliminate(ReadOnlySpan<double> damping)
    {
        var k = SegmentCount;
        var offset = k * n;
        var build = Matrix<double>.Build;
        var dampedDiagonal = new Matrix<double>[k];
        for (var segment = 0; segment < k; segment++)
        {
            dampedDiagonal[segment] = diagonalBlocks[segment].Clone();
            for (var i = 0; i < n; i++)
            {
                dampedDiagonal[segment][i, i] += damping[segment * n + i];
            }
        }

        // Block Thomas: forward elimination of the sub-diagonal, carrying the coupling columns B and the gradient.
        var pivots = new Matrix<double>[k];
        var couplingRhs = new Matrix<double>[k];
        var gradientRhs = new Vector<double>[k];
        try
        {
            pivots[0] = dampedDiagonal[0];
            couplingRhs[0] = couplingBlocks[0];
            gradientRhs[0] = stateGradients[0];
            for (var segment = 1; segment < k; segment++)
            {
                var upper = upperBlocks[segment - 1];
                var multiplier = pivots[segment - 1].Cholesky().Solve(upper).Transpose();
                pivots[segment] = dampedDiagonal[segment] - multiplier * upper;
                couplingRhs[segment] = couplingBlocks[segment] - multiplier * couplingRhs[segment - 1];
                gradientRhs[segment] = stateGradients[segment] - multiplier * gradientRhs[segment - 1];
            }

            var stateSolutions = new Matrix<double>[k];
            var gradientSolutions = new Vector<double>[k];
            var last = pivots[k - 1].Cholesky();
            stateSolutions[k - 1] = last.Solve(couplingRhs[k - 1]);
            gradientSolutions[k - 1] = last.Solve(gradientRhs[k - 1]);
            for (var segment = k - 2; segment >= 0; segment--)
            {
                var factor = pivots[segment].Cholesky();
                stateSolutions[segment] = factor.Solve(couplingRhs[segment] - upperBlocks[segment] * stateSolutions[segment + 1]);
                gradientSolutions[segment] = factor.Solve(gradientRhs[segment] - upperBlocks[segment] * gradientSolutions[segment + 1]);
            }

            var schur = globalBlock.Clone();
            for (var p = 0; p < GlobalCount; p++)
            {
                schur[p, p] += damping[offset + p];
            }

            var rhs = -globalGradient;
            for (var segment = 0; segment < k; segment++)
            {
                schur -= couplingBlocks[segment].TransposeThisAndMultiply(stateSolutions[segment]);
                rhs += couplingBlocks[segment].TransposeThisAndMultiply(gradientSolutions[segment]);
            }

            // Symmetrize against rounding before the Cholesky factorization.
            schur = 0.5 * (schur + schur.Transpose());
            return (stateSolutions, gradientSolutions, schur, rhs);
        }
        catch (ArgumentException)
        {
            return (null, null, null, Vector<double>.Build.Dense(GlobalCount));
        }
    }

    private SegmentLinearization? LinearizeSegment(double[] unknowns, int k)
    {
        var solution = Integrate(unknowns, k, withSensitivities: true);
        if (solution.Status is not SolveStatus.Succeeded)
        {
            return null;
        }

        // Per channel, the Jacobian row of a sample is -sqrt(w) [g dx_m/ds, g dx_m/dp, 1, x_m] (state, field
        // parameters, offset, gain) with w the Huber weight over sigma squared. Accumulating the weighted moments of
        // v = [dx_m/ds, dx_m/dp, x_m] once per channel and scaling by the gain afterwards keeps the per-sample work to
        // one symmetric rank-one update of size n + P + 1.
        var length = n + fieldParameters + 1;
        Span<double> moments = stackalloc double[length * length];
        Span<double> weightedSum = stackalloc double[length];
        Span<double> weightedMisfit = stackalloc double[length];
        Span<double> v = stackalloc double[length];
        var stateBlock = new double[n * n];
        var coupling = new double[n * GlobalCount];
        var global = new double[GlobalCount * GlobalCount];
        var stateGradient = new double[n];
        var globalGradientPart = new double[GlobalCount];
        var first = boundaries[k];
        var lastOwned = k == SegmentCount - 1 ? boundaries[k + 1] : boundaries[k + 1] - 1;
        for (var c = 0; c < channels.Count; c++)
        {
            moments.Clear();
            weightedSum.Clear();
            weightedMisfit.Clear();
            var m = channels[c].StateIndex;
            var gain = GainOf(unknowns, c);
            var offset = OffsetOf(unknowns, c);
            var sigma = channels[c].NoiseSdVolts;
            var observed = samples[c];
            var huber = huberWeights[c];
            var kept = linearizedResiduals[c];
            var excluded = excludedWeights[c];
            double weightTotal = 0, misfitTotal = 0;
            for (var i = first; i <= lastOwned; i++)
            {
                var local = i - first;
                var state = solution.StateAt(local);
                var misfit = observed[i] - gain * state[m] - offset;
                kept[i] = misfit / sigma;
                var size = Math.Abs(kept[i]);
                huber[i] = excluded[i] * (options.HuberThreshold is { } threshold && size > threshold && double.IsFinite(size) ? threshold / size : 1);
                var w = huber[i] / (sigma * sigma);
                if (w == 0)
                {
                    continue;
                }

                solution.StateSensitivityAt(local).Slice(m * n, n).CopyTo(v);
                solution.ParameterSensitivityAt(local).Slice(m * fieldParameters, fieldParameters).CopyTo(v[n..]);
                v[length - 1] = state[m];
                weightTotal += w;
                misfitTotal += w * misfit;
                for (var a = 0; a < length; a++)
                {
                    var wa = w * v[a];
                    weightedSum[a] += wa;
                    weightedMisfit[a] += wa * misfit;
                    var row = moments.Slice(a * length, length);
                    for (var b = a; b < length; b++)
                    {
                        row[b] += wa * v[b];
                    }
                }
            }

            for (var a = 1; a < length; a++)
            {
                for (var b = 0; b < a; b++)
                {
                    moments[a * length + b] = moments[b * length + a];
                }
            }

            AddChannelMoments(c, gain, moments, weightedSum, weightedMisfit, weightTotal, misfitTotal, stateBlock, coupling, global, stateGradient, globalGradientPart);
        }

        var build = Matrix<double>.Build;
        var endIndex = solution.Count - 1;
        var endState = solution.StateAt(endIndex);
        var endStateSensitivity = build.Dense(n, n, (i, j) => solution.StateSensitivityAt(endIndex)[i * n + j]);
        var endParameterSensitivity = build.Dense(n, fieldParameters, (i, p) => solution.ParameterSensitivityAt(endIndex)[i * fieldParameters + p]);
        var mismatch = Vector<double>.Build.Dense(n);
        if (k < SegmentCount - 1)
        {
            for (var i = 0; i < n; i++)
            {
                mismatch[i] = continuityWeight * (endState[i] - unknowns[(k + 1) * n + i]);
            }
        }

        return new SegmentLinearization(
            build.Dense(n, n, (a, b) => stateBlock[a * n + b]),
            build.Dense(n, GlobalCount, (a, b) => coupling[a * GlobalCount + b]),
            build.Dense(GlobalCount, GlobalCount, (a, b) => global[a * GlobalCount + b]),
            Vector<double>.Build.Dense(stateGradient),
            Vector<double>.Build.Dense(globalGradientPart),
            endStateSensitivity,
            endParameterSensitivity,
            mismatch);
    }

    /// <summary>Adds one channel's weighted moments (Σ w v vᵀ, Σ w v, Σ w v e, Σ w, Σ w e) to the Gauss-Newton blocks.</summary>
    private void AddChannelMoments(
        int c,
        double gain,
        ReadOnlySpan<double> moments,
        ReadOnlySpan<double> weightedSum,
        ReadOnlySpan<double> weightedMisfit,
        double weightTotal,
        double misfitTotal,
        double[] stateBlock,
        double[] coupling,
        double[] global,
        double[] stateGradient,
        double[] globalGradient)
    {
        var length = n + fieldParameters + 1;
        var globals = GlobalCount;
        var offsetSlot = offsetCount > 0 ? fieldParameters + c : -1;
        var gainIndex = Array.IndexOf(gainChannels, c);
        var gainSlot = gainIndex < 0 ? -1 : fieldParameters + offsetCount + gainIndex;
        var xIndex = length - 1;
        var g2 = gain * gain;
        for (var a = 0; a < n; a++)
        {
            stateGradient[a] -= gain * weightedMisfit[a];
            for (var b = 0; b < n; b++)
            {
                stateBlock[a * n + b] += g2 * moments[(a * length) + b];
            }

            for (var p = 0; p < fieldParameters; p++)
            {
                coupling[a * globals + p] += g2 * moments[(a * length) + n + p];
            }

            if (offsetSlot >= 0)
            {
                coupling[a * globals + offsetSlot] += gain * weightedSum[a];
            }

            if (gainSlot >= 0)
            {
                coupling[a * globals + gainSlot] += gain * moments[(a * length) + xIndex];
            }
        }

        for (var p = 0; p < fieldParameters; p++)
        {
            globalGradient[p] -= gain * weightedMisfit[n + p];
            for (var q = 0; q < fieldParameters; q++)
            {
                global[p * globals + q] += g2 * moments[((n + p) * length) + n + q];
            }

            if (offsetSlot >= 0)
            {
                global[p * globals + offsetSlot] += gain * weightedSum[n + p];
                global[offsetSlot * globals + p] += gain * weightedSum[n + p];
            }

            if (gainSlot >= 0)
            {
                global[p * globals + gainSlot] += gain * moments[((n + p) * length) + xIndex];
                global[gainSlot * globals + p] += gain * moments[((n + p) * length) + xIndex];
            }
        }

        if (offsetSlot >= 0)
        {
            globalGradient[offsetSlot] -= misfitTotal;
            global[offsetSlot * globals + offsetSlot] += weightTotal;
        }

        if (gainSlot >= 0)
        {
            globalGradient[gainSlot] -= weightedMisfit[xIndex];
            global[gainSlot * globals + gainSlot] += moments[(xIndex * length) + xIndex];
            if (offsetSlot >= 0)
            {
                global[offsetSlot * globals + gainSlot] += weightedSum[xIndex];
                global[gainSlot * globals + offsetSlot] += weightedSum[xIndex];
            }
        }
    }

    private double SegmentCost(double[] unknowns, int k, OdeSolution solution, double[][]? residuals)
    {
        var first = boundaries[k];
        var lastOwned = k == SegmentCount - 1 ? boundaries[k + 1] : boundaries[k + 1] - 1;
        var cost = 0.0;
        for (var i = first; i <= lastOwned; i++)
        {
            var state = solution.StateAt(i - first);
            for (var c = 0; c < channels.Count; c++)
            {
                var channel = channels[c];
                var misfit = (samples[c][i] - GainOf(unknowns, c) * state[channel.StateIndex] - OffsetOf(unknowns, c)) / channel.NoiseSdVolts;
                if (residuals is not null)
                {
                    residuals[c][i] = misfit;
                }

                cost += excludedWeights[c][i] * HuberLoss(misfit);
            }
        }

        if (k < SegmentCount - 1)
        {
            var end = solution.StateAt(solution.Count - 1);
            for (var i = 0; i < n; i++)
            {
                var q = continuityWeight * (end[i] - unknowns[(k + 1) * n + i]);
                cost += q * q;
            }
        }

        return cost;
    }

    private double GainPriorCost(double[] unknowns)
    {
        var cost = 0.0;
        if (offsetCount > 0 && options.ChannelOffsetPriorSdVolts is { } offsetSd)
        {
            for (var c = 0; c < offsetCount; c++)
            {
                var r = OffsetOf(unknowns, c) / offsetSd;
                cost += r * r;
            }
        }

        foreach (var prior in options.ParameterPriors)
        {
            var r = (unknowns[SegmentCount * n + prior.Index] - prior.Mean) / prior.Sd;
            cost += r * r;
        }

        foreach (var c in gainChannels)
        {
            var channel = channels[c];
            var r = (GainOf(unknowns, c) / channel.NominalGain - 1) / channel.GainPriorRelativeSd!.Value;
            cost += r * r;
        }

        return cost;
    }

    private void AddGainPriors(double[] unknowns)
    {
        if (offsetCount > 0 && options.ChannelOffsetPriorSdVolts is { } offsetSd)
        {
            for (var c = 0; c < offsetCount; c++)
            {
                var index = fieldParameters + c;
                globalBlock[index, index] += 1 / (offsetSd * offsetSd);
                globalGradient[index] += OffsetOf(unknowns, c) / (offsetSd * offsetSd);
            }
        }

        foreach (var prior in options.ParameterPriors)
        {
            var residual = (unknowns[SegmentCount * n + prior.Index] - prior.Mean) / prior.Sd;
            globalBlock[prior.Index, prior.Index] += 1 / (prior.Sd * prior.Sd);
            globalGradient[prior.Index] += residual / prior.Sd;
        }

        for (var slot = 0; slot < gainChannels.Length; slot++)
        {
            var channel = channels[gainChannels[slot]];
            var derivative = 1 / (channel.NominalGain * channel.GainPriorRelativeSd!.Value);
            var residual = (GainOf(unknowns, gainChannels[slot]) / channel.NominalGain - 1) / channel.GainPriorRelativeSd.Value;
            var index = fieldParameters + offsetCount + slot;
            globalBlock[index, index] += derivative * derivative;
            globalGradient[index] += derivative * residual;
        }
    }

    /// <summary>Huber's rho in the scale of a squared residual: r^2 inside the threshold k, 2k|r| - k^2 outside.</summary>
    /// <remarks>The cost the loop compares must not change between iterations; the weights min(1, k/|r|) that the
    /// linearization refreshes are this rho's iteratively reweighted Gauss-Newton model, so the two agree to first order.</remarks>
    private double HuberLoss(double misfit)
    {
        var size = Math.Abs(misfit);
        return options.HuberThreshold is { } k && size > k ? (2 * k * size) - (k * k) : misfit * misfit;
    }

    private OdeSolution Integrate(double[] unknowns, int k, bool withSensitivities)
    {
        var initial = ImmutableArray.Create(unknowns, k * n, n);
        var parameters = ImmutableArray.Create(unknowns, SegmentCount * n, fieldParameters);
        var times = segmentTimes[k];
        var problem = new OdeProblem(field, initial, times[0], times[^1], parameters);
        var method = new DormandPrince45
        {
            RelativeTolerance = options.RelativeTolerance,
            AbsoluteTolerance = options.AbsoluteToleranceVolts,
            SampleTimes = times,
            Sensitivities = withSensitivities ? new ForwardSensitivities() : null,
            MaxSteps = 200_000,
        };
        return OdeSolver.Solve(problem, method);
    }

    private void ForEachSegment(Action<int> body)
    {
        if (options.Parallel && SegmentCount > 1)
        {
            System.Threading.Tasks.Parallel.For(0, SegmentCount, body);
        }
        else
        {
            for (var k = 0; k < SegmentCount; k++)
            {
                body(k);
            }
        }
    }

    private sealed record SegmentLinearization(
        Matrix<double> StateBlock,
        Matrix<double> CouplingBlock,
        Matrix<double> GlobalBlock,
        Vector<double> StateGradient,
        Vector<double> GlobalGradient,
        Matrix<double> EndStateSensitivity,
        Matrix<double> EndParameterSensitivity,
        Vector<double> ContinuityMismatch);
}
