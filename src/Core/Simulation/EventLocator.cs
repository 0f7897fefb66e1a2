using System.Collections.Immutable;
using Patchproof.Core.Models;

namespace Patchproof.Core.Simulation;

/// <summary>Watches the event functions across each accepted step and locates their zeros on the step's dense output.</summary>
/// <remarks>See <see cref="OdeEvent"/> for the rules. Scratch buffers are allocated once; only a found event allocates (its record).</remarks>
internal sealed class EventLocator
{
    private readonly ImmutableArray<OdeEvent> events;
    private readonly DormandPrince45Stepper stepper;
    private readonly double[] previousValues;
    private readonly double[] interpolated;
    private readonly double[] derivative;
    private readonly List<OdeEventOccurrence> found = [];
    private bool initialized;

    public EventLocator(ImmutableArray<OdeEvent> events, DormandPrince45Stepper stepper, IOdeSystem system)
    {
        this.events = events;
        this.stepper = stepper;
        foreach (var item in events)
        {
            Preconditions.CheckArgumentRange(nameof(DormandPrince45.Events), item is not null && (!item.IsMaximum || item.StateIndex < system.StateCount),
                "each event must be set and a maximum must name a state index below the state count");
        }

        previousValues = new double[events.Length];
        interpolated = new double[system.StateCount];
        derivative = new double[system.StateCount];
    }

    /// <summary>The events found in the last step, in time order, up to and including a terminal one.</summary>
    public IReadOnlyList<OdeEventOccurrence> FoundInLastStep => found;

    /// <summary>Checks the step just accepted; returns the time of the first terminal event in it, or null.</summary>
    public double? CheckLastStep()
    {
        found.Clear();
        var t0 = stepper.PreviousTime;
        var t1 = stepper.Time;
        if (!initialized)
        {
            for (var i = 0; i < events.Length; i++)
            {
                previousValues[i] = ValueAtStepEnd(events[i], t0, stepper.PreviousState, stepper.PreviousDerivative);
            }

            initialized = true;
        }

        double? terminalTime = null;
        var direction = t1 >= t0 ? 1.0 : -1.0;
        for (var i = 0; i < events.Length; i++)
        {
            var item = events[i];
            var g0 = previousValues[i];
            var g1 = ValueAtStepEnd(item, t1, stepper.State, stepper.Derivative);
            previousValues[i] = g1;
            if (!IsCrossing(InTimeOrder(item.Direction, direction), g0, g1))
            {
                continue;
            }

            var function = new InterpolatedEventFunction(this, item);
            var tolerance = 4.0 * BrentRootFinder.MachineEpsilon * Math.Max(Math.Abs(t0), Math.Abs(t1));
            var root = BrentRootFinder.FindRoot(ref function, t0, t1, g0, g1, tolerance);
            stepper.InterpolateLastStep(root, interpolated);
            found.Add(new OdeEventOccurrence(i, root, [.. interpolated]));
            if (item.IsTerminal && (terminalTime is null || direction * (root - terminalTime.Value) < 0))
            {
                terminalTime = root;
            }
        }

        if (found.Count > 1)
        {
            found.Sort((left, right) => (direction * left.Time).CompareTo(direction * right.Time));
        }

        if (terminalTime is { } stop)
        {
            found.RemoveAll(occurrence => direction * (occurrence.Time - stop) > 0);
        }

        return terminalTime;
    }

    // Directions are defined as t increases; integrating backwards meets every crossing the other way round.
    private static EventDirection InTimeOrder(EventDirection eventDirection, double integrationDirection) =>
        integrationDirection > 0 ? eventDirection : eventDirection switch
        {
            EventDirection.Rising => EventDirection.Falling,
            EventDirection.Falling => EventDirection.Rising,
            _ => EventDirection.Any,
        };

    private static bool IsCrossing(EventDirection direction, double g0, double g1) => direction switch
    {
        EventDirection.Rising => g0 < 0 && g1 >= 0,
        EventDirection.Falling => g0 > 0 && g1 <= 0,
        _ => (g0 < 0 && g1 >= 0) || (g0 > 0 && g1 <= 0),
    };

    private static double ValueAtStepEnd(OdeEvent item, double time, ReadOnlySpan<double> state, ReadOnlySpan<double> stateDerivative) =>
        item.IsMaximum ? stateDerivative[item.StateIndex] : item.Function!(time, state);

    private double ValueInside(OdeEvent item, double time)
    {
        stepper.InterpolateLastStep(time, interpolated);
        if (!item.IsMaximum)
        {
            return item.Function!(time, interpolated);
        }

        stepper.EvaluateStateDerivative(time, interpolated, derivative);
        return derivative[item.StateIndex];
    }

    private readonly struct InterpolatedEventFunction(EventLocator locator, OdeEvent item) : IScalarFunction
    {
        public double Evaluate(double x) => locator.ValueInside(item, x);
    }
}
