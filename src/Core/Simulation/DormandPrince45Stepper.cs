using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using Patchproof.Core.Models;
using static Patchproof.Core.Simulation.DormandPrince45Tableau;

namespace Patchproof.Core.Simulation;

/// <summary>Streams the Dormand-Prince 5(4) solution of one problem step by step, without allocating per step.</summary>
/// <remarks>
/// <para>Each <see cref="Step"/> call attempts steps until one is accepted by the error control (see
/// <see cref="StepSizeController"/> and the RMS norm described on <see cref="DormandPrince45"/>), then
/// returns true; it returns false once the integration has finished, with the reason in <see cref="Status"/>.
/// The last step is shortened to end exactly at the end time; no stage is ever evaluated past it.</para>
/// <para>The seventh stage f(t + h, y1) is reused as the next step's first (first same as last), so an
/// accepted step costs six evaluations. All buffers are allocated once in the constructor and swapped
/// between steps. <see cref="State"/>, <see cref="PreviousState"/> and the dense output of the last step
/// stay valid until the next <see cref="Step"/> call.</para>
/// <para>With <see cref="DormandPrince45.Sensitivities"/> set, the variational equations (see
/// <see cref="ForwardSensitivities"/>) are integrated with the state as one augmented vector of
/// n + n·n + n·m components.</para>
/// <para>The first step, unless given, follows Hairer's heuristic: with d0 = ‖y0‖, d1 = ‖f0‖ (scaled norms),
/// h0 = 0.01 d0/d1 (1e-6 if either is below 1e-5), an explicit Euler step to get d2 = ‖f1 - f0‖/h0, and
/// h = min(100 h0, (0.01 / max(d1, d2))^(1/5), |t1 - t0|, MaxStep).</para>
/// <para>The step is too small when |h| &lt; 10 ulp(t); the integration then stops with
/// <see cref="SolveStatus.StepSizeTooSmall"/>. A NaN or infinity in a step stops it with
/// <see cref="SolveStatus.NonFiniteState"/> at the last good time.</para>
/// <para>For the common case use <see cref="OdeSolver.Solve"/>.</para>
/// <para>References:
/// 1. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, Sec. II.4-II.6 and code DOPRI5.
/// 2. SciPy <c>scipy/integrate/_ivp/rk.py</c> and <c>common.py</c> (select_initial_step).</para>
/// </remarks>
public sealed class DormandPrince45Stepper
{
    private readonly IOdeSystem system;
    private readonly double[] parameters;
    private readonly int stateCount;
    private readonly int parameterCount;
    private readonly int dimension;
    private readonly bool hasSensitivities;
    private readonly double relativeTolerance;
    private readonly double[] absoluteTolerances;
    private readonly double maxStep;
    private readonly double fixedStep;
    private readonly double firstStep;
    private readonly int maxSteps;
    private readonly long maxEvaluations;
    private readonly StepSizeController controller;
    private readonly double endTime;
    private readonly double direction;

    private readonly DormandPrince45DenseOutput.DenseWeights denseWeights;

    private readonly double[] k2, k3, k4, k5, k6, stage, error, stateJacobian, parameterJacobian, denseCoefficients;
    private double[] y, yNew, k1, k7;

    private double time;
    private double previousTime;
    private double lastStep;
    private double nextStepMagnitude;
    private static readonly double LogInitialPreviousErrorNorm = Math.Log(StepSizeController.InitialPreviousErrorNorm);
    private double logPreviousErrorNorm = LogInitialPreviousErrorNorm;
    private bool lastAttemptRejected;
    private bool started;
    private bool denseValid;
    private long evaluations;
    private long jacobianEvaluations;
    private long accepted;
    private long rejected;

    /// <summary>Prepares to integrate <paramref name="problem"/> with <paramref name="options"/>.</summary>
    /// <param name="problem">The problem; its initial state and parameters are copied.</param>
    /// <param name="options">The method options (events and samples are handled by <see cref="OdeSolver"/>, not here).</param>
    /// <exception cref="ArgumentOutOfRangeException">When a tolerance is negative, a vector has the wrong length, or a value is not finite.</exception>
    public DormandPrince45Stepper(OdeProblem problem, DormandPrince45 options)
    {
        ArgumentNullException.ThrowIfNull(problem);
        ArgumentNullException.ThrowIfNull(options);
        problem.Validate();
        options.Validate();
        system = problem.System;
        stateCount = system.StateCount;
        parameterCount = system.ParameterCount;
        Preconditions.CheckArgumentRange(nameof(options.AbsoluteTolerances), options.AbsoluteTolerances.IsDefault || options.AbsoluteTolerances.Length == stateCount,
            $"must have {stateCount} entries, one per state variable");
        hasSensitivities = options.Sensitivities is not null;
        dimension = hasSensitivities ? stateCount * (1 + stateCount + parameterCount) : stateCount;
        parameters = [.. problem.Parameters];
        relativeTolerance = options.RelativeTolerance;
        var errorCount = hasSensitivities && options.Sensitivities!.IncludeInErrorControl ? dimension : stateCount;
        absoluteTolerances = new double[errorCount];
        for (var i = 0; i < errorCount; i++)
        {
            absoluteTolerances[i] = i < stateCount && !options.AbsoluteTolerances.IsDefault ? options.AbsoluteTolerances[i] : options.AbsoluteTolerance;
        }

        Preconditions.CheckArgumentRange(nameof(options.AbsoluteTolerance), relativeTolerance > 0 || absoluteTolerances.All(tolerance => tolerance > 0),
            "and the relative tolerance must not both be zero");
        maxStep = options.MaxStep;
        fixedStep = options.FixedStep;
        firstStep = options.FirstStep;
        maxSteps = options.MaxSteps;
        maxEvaluations = options.MaxEvaluations;
        controller = options.Controller;
        StartTime = problem.StartTime;
        endTime = problem.EndTime;
        direction = endTime >= StartTime ? 1.0 : -1.0;

        var p = DormandPrince45Tableau.Instance.P;
        denseWeights = new DormandPrince45DenseOutput.DenseWeights(p[0][3], p[2][3], p[3][3], p[4][3], p[5][3], p[6][3]);

        y = new double[dimension];
        yNew = new double[dimension];
        k1 = new double[dimension];
        k2 = new double[dimension];
        k3 = new double[dimension];
        k4 = new double[dimension];
        k5 = new double[dimension];
        k6 = new double[dimension];
        k7 = new double[dimension];
        stage = new double[dimension];
        error = new double[dimension];
        denseCoefficients = new double[5 * dimension];
        stateJacobian = hasSensitivities ? new double[stateCount * stateCount] : [];
        parameterJacobian = hasSensitivities ? new double[stateCount * parameterCount] : [];
        problem.InitialState.AsSpan().CopyTo(y);
        if (hasSensitivities)
        {
            for (var i = 0; i < stateCount; i++)
            {
                y[stateCount + (i * stateCount) + i] = 1.0;
            }
        }

        time = StartTime;
        previousTime = StartTime;
        if (endTime == StartTime)
        {
            Finish(SolveStatus.Succeeded);
        }
    }

    /// <summary>The initial time t0.</summary>
    public double StartTime { get; }

    /// <summary>The end time of the problem.</summary>
    public double EndTime => endTime;

    /// <summary>The time reached by the last accepted step (t0 before the first).</summary>
    public double Time => time;

    /// <summary>The start of the last accepted step.</summary>
    public double PreviousTime => previousTime;

    /// <summary>The signed size of the last accepted step (0 before the first).</summary>
    public double LastStepSize => lastStep;

    /// <summary>The number of state variables n.</summary>
    public int StateCount => stateCount;

    /// <summary>The number of parameters m.</summary>
    public int ParameterCount => parameterCount;

    /// <summary>Whether the forward sensitivities are integrated.</summary>
    public bool HasSensitivities => hasSensitivities;

    /// <summary>The state at <see cref="Time"/> (length n).</summary>
    public ReadOnlySpan<double> State => y.AsSpan(0, stateCount);

    /// <summary>The state at <see cref="PreviousTime"/> (length n), valid after an accepted step.</summary>
    public ReadOnlySpan<double> PreviousState => yNew.AsSpan(0, stateCount);

    /// <summary>dx/dx0 at <see cref="Time"/>, n by n row-major.</summary>
    /// <exception cref="InvalidOperationException">When sensitivities were not requested.</exception>
    public ReadOnlySpan<double> StateSensitivity => hasSensitivities
        ? y.AsSpan(stateCount, stateCount * stateCount)
        : throw new InvalidOperationException("Sensitivities were not requested; set DormandPrince45.Sensitivities.");

    /// <summary>dx/dp at <see cref="Time"/>, n by m row-major.</summary>
    /// <exception cref="InvalidOperationException">When sensitivities were not requested.</exception>
    public ReadOnlySpan<double> ParameterSensitivity => hasSensitivities
        ? y.AsSpan(stateCount * (1 + stateCount), stateCount * parameterCount)
        : throw new InvalidOperationException("Sensitivities were not requested; set DormandPrince45.Sensitivities.");

    /// <summary>Whether the integration has finished; <see cref="Status"/> then says why.</summary>
    public bool IsFinished { get; private set; }

    /// <summary>Why the integration finished; meaningful once <see cref="IsFinished"/> is true.</summary>
    public SolveStatus Status { get; private set; }

    /// <summary>The work done so far.</summary>
    public SolverStatistics Statistics => new(evaluations, jacobianEvaluations, accepted, rejected);

    /// <summary>The number of components integrated: n, or n + n·n + n·m with sensitivities.</summary>
    internal int Dimension => dimension;

    /// <summary>The full integrated vector at <see cref="Time"/>.</summary>
    internal ReadOnlySpan<double> AugmentedState => y;

    /// <summary>f at <see cref="Time"/> (the first stage of the next step), valid after an accepted step.</summary>
    internal ReadOnlySpan<double> Derivative => k1.AsSpan(0, stateCount);

    /// <summary>f at <see cref="PreviousTime"/>, valid after an accepted step.</summary>
    internal ReadOnlySpan<double> PreviousDerivative => k7.AsSpan(0, stateCount);

    /// <summary>The parameters the system is evaluated with.</summary>
    internal ReadOnlySpan<double> Parameters => parameters;

    /// <summary>Advances by one accepted step.</summary>
    /// <returns>True when a step was accepted (the last one sets <see cref="IsFinished"/>); false when the integration had already finished or stopped now without a step.</returns>
    // Implementation note: Step and TryStep are left to tiered compilation on purpose. Its profile lets
    // the JIT devirtualize the call through IOdeSystem and inline the model into every stage, which
    // made a Lorenz step about a third faster than compiling them once up front (BenchmarkDotNet,
    // docs/performance.md). The long loop that calls Step (DormandPrince45Run) is compiled up front.
    public bool Step()
    {
        if (IsFinished)
        {
            return false;
        }

        if (!started)
        {
            started = true;
            evaluations++;
            EvaluateRightHandSide(time, y, k1);
            nextStepMagnitude = fixedStep > 0 ? fixedStep : firstStep > 0 ? Math.Min(firstStep, maxStep) : InitialStepMagnitude();
        }

        while (true)
        {
            if (accepted + rejected >= maxSteps)
            {
                Finish(SolveStatus.MaxStepsExceeded);
                return false;
            }

            if (evaluations + 6 > maxEvaluations)
            {
                Finish(SolveStatus.MaxEvaluationsExceeded);
                return false;
            }

            // 10 ulp(t) is at most 2.3e-15 |t|: only a step up to 1e-13 |t| needs the exact test (a NaN or zero step fails both).
            if (!(nextStepMagnitude > 1e-13 * Math.Abs(time)) && !(nextStepMagnitude >= 10.0 * Math.Abs(Math.BitIncrement(Math.Abs(time)) - Math.Abs(time))))
            {
                Finish(SolveStatus.StepSizeTooSmall);
                return false;
            }

            var stepSize = direction * nextStepMagnitude;
            var newTime = time + stepSize;
            if (direction * (newTime - endTime) >= 0)
            {
                newTime = endTime;
                stepSize = endTime - time;
            }

            // The squared norm saves a square root on the step's critical path: ‖e‖ ≤ 1 exactly when ‖e‖² ≤ 1,
            // and ln ‖e‖ = ln(‖e‖²) / 2.
            var errorNormSquared = TryStep(stepSize, newTime);
            if (double.IsNaN(errorNormSquared))
            {
                Finish(SolveStatus.NonFiniteState);
                return false;
            }

            var logErrorNorm = 0.5 * Math.Log(errorNormSquared);
            var factor = controller.ProposeFactorFromLogarithms(logErrorNorm, logPreviousErrorNorm, lastAttemptRejected);
            if (fixedStep > 0 || errorNormSquared <= 1.0)
            {
                logPreviousErrorNorm = Math.Max(logErrorNorm, LogInitialPreviousErrorNorm);
                nextStepMagnitude = fixedStep > 0 ? fixedStep : Math.Min(Math.Abs(stepSize) * factor, maxStep);
                previousTime = time;
                time = newTime;
                lastStep = stepSize;
                (y, yNew) = (yNew, y);
                (k1, k7) = (k7, k1);
                accepted++;
                lastAttemptRejected = false;
                denseValid = false;
                if (newTime == endTime)
                {
                    Finish(SolveStatus.Succeeded);
                }

                return true;
            }

            rejected++;
            lastAttemptRejected = true;
            nextStepMagnitude = Math.Abs(stepSize) * factor;
        }
    }

    /// <summary>A copy of the last accepted step's interpolant (allocates; for streaming use).</summary>
    /// <returns>The dense output over [PreviousTime, Time] for the state, or a constant before the first step.</returns>
    public IDenseOutput CreateDenseOutput()
    {
        if (accepted == 0)
        {
            return new ConstantDenseOutput(time, State);
        }

        return new DormandPrince45DenseOutput(previousTime, lastStep, LastStepCoefficients(), dimension);
    }

    /// <summary>Writes the interpolated full vector (state, then sensitivities) at <paramref name="at"/> within the last step.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal void InterpolateLastStep(double at, Span<double> destination)
    {
        if (at == time)
        {
            y.AsSpan(0, destination.Length).CopyTo(destination);
            return;
        }

        DormandPrince45DenseOutput.Interpolate(LastStepCoefficients(), dimension, (at - previousTime) / lastStep, destination);
    }

    /// <summary>The r1..r5 coefficients of the last accepted step (computed once per step, on demand).</summary>
    internal ReadOnlySpan<double> LastStepCoefficients()
    {
        if (!denseValid)
        {
            // After the buffer swap: yNew holds y0, k7 holds the step's K1 and k1 holds its K7.
            DormandPrince45DenseOutput.ComputeCoefficients(lastStep, yNew, y, k7, k3, k4, k5, k6, k1, denseWeights, denseCoefficients);
            denseValid = true;
        }

        return denseCoefficients;
    }

    /// <summary>Evaluates f for the state part only (for event location), counting the evaluation.</summary>
    internal void EvaluateStateDerivative(double at, ReadOnlySpan<double> state, Span<double> derivative)
    {
        evaluations++;
        system.Evaluate(at, state, parameters, derivative);
    }

    private double TryStep(double h, double newTime)
    {
        // Implementation note: every buffer holds exactly `dimension` values, so the stage loops index
        // through references without per-element bounds checks; for n = 3 those checks cost about as
        // much as the arithmetic. Each stage adds the newest derivative last, as one product onto a sum
        // of the older ones: a step is a chain of stages, each waiting for the one before, and that
        // order leaves one fused multiply-add (exactly rounded everywhere) between a derivative and the next stage.
        var n = dimension;
        evaluations += 6;
        ref var y0 = ref MemoryMarshal.GetArrayDataReference(y);
        ref var s = ref MemoryMarshal.GetArrayDataReference(stage);
        ref var f1 = ref MemoryMarshal.GetArrayDataReference(k1);
        ref var f2 = ref MemoryMarshal.GetArrayDataReference(k2);
        ref var f3 = ref MemoryMarshal.GetArrayDataReference(k3);
        ref var f4 = ref MemoryMarshal.GetArrayDataReference(k4);
        ref var f5 = ref MemoryMarshal.GetArrayDataReference(k5);
        ref var f6 = ref MemoryMarshal.GetArrayDataReference(k6);
        ref var f7 = ref MemoryMarshal.GetArrayDataReference(k7);
        ref var y1 = ref MemoryMarshal.GetArrayDataReference(yNew);
        ref var inverseScale = ref MemoryMarshal.GetArrayDataReference(error);

        var last = h * A21;
        for (var i = 0; i < n; i++)
        {
            Unsafe.Add(ref s, i) = Math.FusedMultiplyAdd(last, Unsafe.Add(ref f1, i), Unsafe.Add(ref y0, i));
        }

        EvaluateRightHandSide(time + (C2 * h), stage, k2);
        last = h * A32;
        for (var i = 0; i < n; i++)
        {
            Unsafe.Add(ref s, i) = Math.FusedMultiplyAdd(last, Unsafe.Add(ref f2, i), Unsafe.Add(ref y0, i) + (h * A31 * Unsafe.Add(ref f1, i)));
        }

        EvaluateRightHandSide(time + (C3 * h), stage, k3);
        last = h * A43;
        for (var i = 0; i < n; i++)
        {
            Unsafe.Add(ref s, i) = Math.FusedMultiplyAdd(last, Unsafe.Add(ref f3, i),
                Unsafe.Add(ref y0, i) + (h * ((A41 * Unsafe.Add(ref f1, i)) + (A42 * Unsafe.Add(ref f2, i)))));
        }

        EvaluateRightHandSide(time + (C4 * h), stage, k4);
        last = h * A54;
        for (var i = 0; i < n; i++)
        {
            Unsafe.Add(ref s, i) = Math.FusedMultiplyAdd(last, Unsafe.Add(ref f4, i),
                Unsafe.Add(ref y0, i) + (h * ((A51 * Unsafe.Add(ref f1, i)) + (A52 * Unsafe.Add(ref f2, i)) + (A53 * Unsafe.Add(ref f3, i)))));
        }

        EvaluateRightHandSide(time + (C5 * h), stage, k5);
        last = h * A65;
        for (var i = 0; i < n; i++)
        {
            Unsafe.Add(ref s, i) = Math.FusedMultiplyAdd(last, Unsafe.Add(ref f5, i),
                Unsafe.Add(ref y0, i) + (h * ((A61 * Unsafe.Add(ref f1, i)) + (A62 * Unsafe.Add(ref f2, i)) + (A63 * Unsafe.Add(ref f3, i)) + (A64 * Unsafe.Add(ref f4, i)))));
        }

        // Stages 6 and 7 sit at c = 1: use newTime itself so no stage is evaluated past the end time.
        EvaluateRightHandSide(newTime, stage, k6);
        last = h * B6;
        for (var i = 0; i < n; i++)
        {
            Unsafe.Add(ref y1, i) = Math.FusedMultiplyAdd(last, Unsafe.Add(ref f6, i),
                Unsafe.Add(ref y0, i) + (h * ((B1 * Unsafe.Add(ref f1, i)) + (B3 * Unsafe.Add(ref f3, i)) + (B4 * Unsafe.Add(ref f4, i)) + (B5 * Unsafe.Add(ref f5, i)))));
        }

        // The norm's scales need only y0 and y1: their reciprocals are ready before the last stage is, so the
        // error waits for a multiply instead of a division.
        var count = absoluteTolerances.Length;
        ScaledErrorNorm.InverseScales(y, yNew, absoluteTolerances, relativeTolerance, error);
        EvaluateRightHandSide(newTime, yNew, k7);
        last = h * E7;
        var sumOfSquares = 0.0;
        for (var i = 0; i < count; i++)
        {
            var scaled = Math.FusedMultiplyAdd(last, Unsafe.Add(ref f7, i),
                h * ((E1 * Unsafe.Add(ref f1, i)) + (E3 * Unsafe.Add(ref f3, i)) + (E4 * Unsafe.Add(ref f4, i)) + (E5 * Unsafe.Add(ref f5, i)) + (E6 * Unsafe.Add(ref f6, i)))) * Unsafe.Add(ref inverseScale, i);
            sumOfSquares = Math.FusedMultiplyAdd(scaled, scaled, sumOfSquares);
        }

        var normSquared = sumOfSquares / count;

        // A NaN or infinity in the new vector or its derivative makes this sum non-finite. Summed here rather than
        // inside the stage loops, where the extra running value cost a register and a spill in every stage.
        var sum = 0.0;
        for (var i = 0; i < n; i++)
        {
            sum += Unsafe.Add(ref y1, i) + Unsafe.Add(ref f7, i);
        }

        return double.IsFinite(normSquared) && double.IsFinite(sum) ? normSquared : double.NaN;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void EvaluateRightHandSide(double at, double[] vector, double[] derivative)
    {
        // Not counted here: TryStep counts its six evaluations at once, so the stages do not each update a field.
        if (!hasSensitivities)
        {
            system.Evaluate(at, vector, parameters, derivative);
            return;
        }

        EvaluateAugmentedRightHandSide(at, vector, derivative);
    }

    // Kept out of line so that the plain evaluation above inlines into every stage of TryStep.
    [MethodImpl(MethodImplOptions.NoInlining)]
    private void EvaluateAugmentedRightHandSide(double at, double[] vector, double[] derivative)
    {
        var n = stateCount;
        var m = parameterCount;
        var state = vector.AsSpan(0, n);
        system.Evaluate(at, state, parameters, derivative.AsSpan(0, n));
        system.EvaluateStateJacobian(at, state, parameters, stateJacobian);
        system.EvaluateParameterJacobian(at, state, parameters, parameterJacobian);
        jacobianEvaluations++;
        var jacobian = stateJacobian.AsSpan(0, n * n);
        var parameterJacobianSpan = parameterJacobian.AsSpan(0, n * m);
        var sx = vector.AsSpan(n, n * n);
        var sp = vector.AsSpan(n + (n * n), n * m);
        var dsx = derivative.AsSpan(n, n * n);
        var dsp = derivative.AsSpan(n + (n * n), n * m);
        for (var i = 0; i < n; i++)
        {
            var row = jacobian.Slice(i * n, n);
            var dsxRow = dsx.Slice(i * n, n);
            dsxRow.Clear();
            var dspRow = dsp.Slice(i * m, m);
            parameterJacobianSpan.Slice(i * m, m).CopyTo(dspRow);
            for (var k = 0; k < n; k++)
            {
                var jik = row[k];
                if (jik == 0.0)
                {
                    continue;
                }

                var sxRow = sx.Slice(k * n, n);
                for (var j = 0; j < n; j++)
                {
                    dsxRow[j] += jik * sxRow[j];
                }

                var spRow = sp.Slice(k * m, m);
                for (var j = 0; j < m; j++)
                {
                    dspRow[j] += jik * spRow[j];
                }
            }
        }
    }

    private double InitialStepMagnitude()
    {
        var count = absoluteTolerances.Length;
        var interval = Math.Abs(endTime - time);
        double d0 = 0, d1 = 0;
        for (var i = 0; i < count; i++)
        {
            var scale = absoluteTolerances[i] + (relativeTolerance * Math.Abs(y[i]));
            d0 += (y[i] / scale) * (y[i] / scale);
            d1 += (k1[i] / scale) * (k1[i] / scale);
        }

        d0 = Math.Sqrt(d0 / count);
        d1 = Math.Sqrt(d1 / count);
        if (!double.IsFinite(d1))
        {
            // A non-finite derivative: take any step; TryStep reports the non-finite state.
            return Math.Min(interval, maxStep);
        }

        var h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * d0 / d1;
        h0 = Math.Min(h0, interval);
        for (var i = 0; i < dimension; i++)
        {
            stage[i] = y[i] + (direction * h0 * k1[i]);
        }

        evaluations++;
        EvaluateRightHandSide(time + (direction * h0), stage, k2);
        var d2 = 0.0;
        for (var i = 0; i < count; i++)
        {
            var scale = absoluteTolerances[i] + (relativeTolerance * Math.Abs(y[i]));
            var difference = (k2[i] - k1[i]) / scale;
            d2 += difference * difference;
        }

        d2 = Math.Sqrt(d2 / count) / h0;
        var h1 = d1 <= 1e-15 && d2 <= 1e-15
            ? Math.Max(1e-6, h0 * 1e-3)
            : Math.Pow(0.01 / Math.Max(d1, d2), 1.0 / 5.0);
        var magnitude = Math.Min(Math.Min(100 * h0, h1), Math.Min(interval, maxStep));
        return double.IsFinite(magnitude) && magnitude > 0 ? magnitude : Math.Min(interval, maxStep);
    }

    private void Finish(SolveStatus status)
    {
        IsFinished = true;
        Status = status;
    }
}
