using System.Globalization;

namespace Patchproof.Core.Simulation;

/// <summary>The result of a solve: why it stopped, what it cost, the states at the output times, events, and optional dense output.</summary>
/// <remarks>
/// <para>Output times are the accepted step times (starting with t0) or, when samples were requested,
/// the sample times reached. States are stored row by row, n values per time. With sensitivities, the
/// matrices dx/dx0 (n by n) and dx/dp (n by m), row-major, are available at the same times.</para>
/// <para>When dense output was kept, <see cref="Evaluate"/> interpolates anywhere in
/// [<see cref="TMin"/>, <see cref="TMax"/>] by finding the step that holds t with a binary search.</para>
/// <para>A solve that stops early (budget, non-finite state, terminal event) still returns everything
/// computed up to <see cref="FinalTime"/>. Check <see cref="Status"/> before trusting the end state.</para>
/// <para>Reference: 1. SciPy <c>scipy/integrate/_ivp/common.py</c> (OdeSolution); SciML SciMLBase
/// <c>retcodes.jl</c> (return codes).</para>
/// </remarks>
public sealed class OdeSolution
{
    private readonly double[] times;
    private readonly double[] values;
    private readonly double[] finalValues;
    private readonly double[] segmentStarts;
    private readonly double[] segmentSteps;
    private readonly double[] segmentCoefficients;
    private readonly int dimension;

    internal OdeSolution(
        SolveStatus status,
        string message,
        SolverStatistics statistics,
        int stateCount,
        int parameterCount,
        bool hasSensitivities,
        double startTime,
        double finalTime,
        double[] finalValues,
        double[] times,
        double[] values,
        IReadOnlyList<OdeEventOccurrence> events,
        bool hasDenseOutput,
        double[] segmentStarts,
        double[] segmentSteps,
        double[] segmentCoefficients)
    {
        Status = status;
        Message = message;
        Statistics = statistics;
        StateCount = stateCount;
        ParameterCount = parameterCount;
        HasSensitivities = hasSensitivities;
        dimension = hasSensitivities ? stateCount * (1 + stateCount + parameterCount) : stateCount;
        StartTime = startTime;
        FinalTime = finalTime;
        this.finalValues = finalValues;
        this.times = times;
        this.values = values;
        Events = events;
        HasDenseOutput = hasDenseOutput;
        this.segmentStarts = segmentStarts;
        this.segmentSteps = segmentSteps;
        this.segmentCoefficients = segmentCoefficients;
    }

    /// <summary>Why the solve stopped.</summary>
    public SolveStatus Status { get; }

    /// <summary>A sentence for a person, for example "non-finite state at t = 0.5".</summary>
    public string Message { get; }

    /// <summary>Evaluations and steps used.</summary>
    public SolverStatistics Statistics { get; }

    /// <summary>Whether the end time was reached or a terminal event stopped the solve as asked.</summary>
    public bool IsSuccess => Status is SolveStatus.Succeeded or SolveStatus.StoppedByEvent;

    /// <summary>The number of state variables n.</summary>
    public int StateCount { get; }

    /// <summary>The number of parameters m.</summary>
    public int ParameterCount { get; }

    /// <summary>Whether sensitivities were integrated.</summary>
    public bool HasSensitivities { get; }

    /// <summary>The initial time t0.</summary>
    public double StartTime { get; }

    /// <summary>The time the solve reached: the end time on success, else where it stopped.</summary>
    public double FinalTime { get; }

    /// <summary>The state at <see cref="FinalTime"/> (length n).</summary>
    public ReadOnlySpan<double> FinalState => finalValues.AsSpan(0, StateCount);

    /// <summary>dx(FinalTime)/dx0, n by n row-major.</summary>
    /// <exception cref="InvalidOperationException">When sensitivities were not requested.</exception>
    public ReadOnlySpan<double> FinalStateSensitivity => StateSensitivityOf(finalValues);

    /// <summary>dx(FinalTime)/dp, n by m row-major.</summary>
    /// <exception cref="InvalidOperationException">When sensitivities were not requested.</exception>
    public ReadOnlySpan<double> FinalParameterSensitivity => ParameterSensitivityOf(finalValues);

    /// <summary>The number of output times.</summary>
    public int Count => times.Length;

    /// <summary>The output times: step times from t0, or the sample times reached.</summary>
    public ReadOnlySpan<double> Times => times;

    /// <summary>The located events in time order.</summary>
    public IReadOnlyList<OdeEventOccurrence> Events { get; }

    /// <summary>Whether <see cref="Evaluate"/> is available (dense output was kept).</summary>
    public bool HasDenseOutput { get; }

    /// <summary>The number of stored dense-output segments (one per accepted step).</summary>
    public int SegmentCount => segmentStarts.Length;

    /// <summary>The smaller end of the solved interval.</summary>
    public double TMin => Math.Min(StartTime, FinalTime);

    /// <summary>The larger end of the solved interval.</summary>
    public double TMax => Math.Max(StartTime, FinalTime);

    /// <summary>The state at output time <paramref name="index"/> (length n).</summary>
    /// <param name="index">0 to <see cref="Count"/> - 1.</param>
    /// <returns>A view of the stored state.</returns>
    public ReadOnlySpan<double> StateAt(int index) => values.AsSpan(index * dimension, StateCount);

    /// <summary>dx/dx0 at output time <paramref name="index"/>, n by n row-major.</summary>
    /// <param name="index">0 to <see cref="Count"/> - 1.</param>
    /// <returns>A view of the stored matrix.</returns>
    /// <exception cref="InvalidOperationException">When sensitivities were not requested.</exception>
    public ReadOnlySpan<double> StateSensitivityAt(int index) => StateSensitivityOf(values.AsSpan(index * dimension, dimension));

    /// <summary>dx/dp at output time <paramref name="index"/>, n by m row-major.</summary>
    /// <param name="index">0 to <see cref="Count"/> - 1.</param>
    /// <returns>A view of the stored matrix.</returns>
    /// <exception cref="InvalidOperationException">When sensitivities were not requested.</exception>
    public ReadOnlySpan<double> ParameterSensitivityAt(int index) => ParameterSensitivityOf(values.AsSpan(index * dimension, dimension));

    /// <summary>Writes the interpolated state at <paramref name="time"/> into <paramref name="destination"/> (length n).</summary>
    /// <param name="time">A time in [<see cref="TMin"/>, <see cref="TMax"/>].</param>
    /// <param name="destination">Receives the state (length n).</param>
    /// <exception cref="InvalidOperationException">When dense output was not kept.</exception>
    /// <exception cref="ArgumentOutOfRangeException">When <paramref name="time"/> lies outside the solved interval or the destination is not n long.</exception>
    public void Evaluate(double time, Span<double> destination)
    {
        Preconditions.CheckArgumentRange(nameof(destination), destination.Length == StateCount, $"must have {StateCount} entries");
        EvaluateFull(time, destination);
    }

    /// <summary>Writes the interpolated sensitivities at <paramref name="time"/>.</summary>
    /// <param name="time">A time in [<see cref="TMin"/>, <see cref="TMax"/>].</param>
    /// <param name="stateSensitivity">Receives dx/dx0 (n by n row-major).</param>
    /// <param name="parameterSensitivity">Receives dx/dp (n by m row-major).</param>
    /// <exception cref="InvalidOperationException">When dense output was not kept or sensitivities were not requested.</exception>
    /// <exception cref="ArgumentOutOfRangeException">When <paramref name="time"/> lies outside the solved interval or a destination has the wrong length.</exception>
    public void EvaluateSensitivities(double time, Span<double> stateSensitivity, Span<double> parameterSensitivity)
    {
        if (!HasSensitivities)
        {
            throw new InvalidOperationException("Sensitivities were not requested; set DormandPrince45.Sensitivities.");
        }

        var n = StateCount;
        Preconditions.CheckArgumentRange(nameof(stateSensitivity), stateSensitivity.Length == n * n, $"must have {n * n} entries");
        Preconditions.CheckArgumentRange(nameof(parameterSensitivity), parameterSensitivity.Length == n * ParameterCount, $"must have {n * ParameterCount} entries");
        var buffer = new double[dimension];
        EvaluateFull(time, buffer);
        buffer.AsSpan(n, n * n).CopyTo(stateSensitivity);
        buffer.AsSpan(n * (1 + n), n * ParameterCount).CopyTo(parameterSensitivity);
    }

    /// <summary>The interpolant of one accepted step, as its own object.</summary>
    /// <param name="index">0 to <see cref="SegmentCount"/> - 1.</param>
    /// <returns>A copy of the step's dense output.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When <paramref name="index"/> is out of range.</exception>
    public DormandPrince45DenseOutput Segment(int index)
    {
        Preconditions.CheckArgumentRange(nameof(index), index >= 0 && index < SegmentCount, $"must be in [0, {SegmentCount})");
        return new DormandPrince45DenseOutput(segmentStarts[index], segmentSteps[index], segmentCoefficients.AsSpan(index * 5 * dimension, 5 * dimension), dimension);
    }

    private void EvaluateFull(double time, Span<double> destination)
    {
        if (!HasDenseOutput)
        {
            throw new InvalidOperationException("Dense output was not kept; set DormandPrince45.KeepDenseOutput.");
        }

        Preconditions.CheckArgumentRange(nameof(time), time >= TMin && time <= TMax,
            string.Create(CultureInfo.InvariantCulture, $"must lie in the solved interval [{TMin}, {TMax}]"));
        if (SegmentCount == 0 || time == FinalTime)
        {
            finalValues.AsSpan(0, destination.Length).CopyTo(destination);
            return;
        }

        var segment = FindSegment(time);
        var coefficients = segmentCoefficients.AsSpan(segment * 5 * dimension, 5 * dimension);
        DormandPrince45DenseOutput.Interpolate(coefficients, dimension, (time - segmentStarts[segment]) / segmentSteps[segment], destination);
    }

    private int FindSegment(double time)
    {
        // The last segment whose start is not beyond t in the direction of integration.
        var sign = FinalTime >= StartTime ? 1.0 : -1.0;
        int low = 0, high = segmentStarts.Length - 1;
        while (low < high)
        {
            var middle = (low + high + 1) / 2;
            if (sign * (segmentStarts[middle] - time) <= 0)
            {
                low = middle;
            }
            else
            {
                high = middle - 1;
            }
        }

        return low;
    }

    private ReadOnlySpan<double> StateSensitivityOf(ReadOnlySpan<double> vector) => HasSensitivities
        ? vector.Slice(StateCount, StateCount * StateCount)
        : throw new InvalidOperationException("Sensitivities were not requested; set DormandPrince45.Sensitivities.");

    private ReadOnlySpan<double> ParameterSensitivityOf(ReadOnlySpan<double> vector) => HasSensitivities
        ? vector.Slice(StateCount * (1 + StateCount), StateCount * ParameterCount)
        : throw new InvalidOperationException("Sensitivities were not requested; set DormandPrince45.Sensitivities.");
}
