using System.Runtime.CompilerServices;
namespace Patchproof.Core.Simulation;

/// <summary>Drives a <see cref="DormandPrince45Stepper"/> to the end, recording steps or samples, events and dense output.</summary>
internal static class DormandPrince45Run
{
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static OdeSolution Solve(OdeProblem problem, DormandPrince45 options)
    {
        var stepper = new DormandPrince45Stepper(problem, options);
        var sampleTimes = SampleGrid.Build(options, problem.StartTime, problem.EndTime);
        var events = options.Events.IsDefaultOrEmpty ? null : new EventLocator(options.Events, stepper, problem.System);
        var dimension = stepper.Dimension;
        var direction = problem.EndTime >= problem.StartTime ? 1.0 : -1.0;
        var keepSteps = options.KeepSteps && sampleTimes is null;

        var stepTimes = new DoubleBuffer(keepSteps ? 1024 : 0);
        var stepValues = new DoubleBuffer(keepSteps ? 1024 * dimension : 0);
        var sampleValues = sampleTimes is null ? [] : new double[sampleTimes.Length * dimension];
        var samplesDone = 0;
        var segmentStarts = new DoubleBuffer(options.KeepDenseOutput ? 1024 : 0);
        var segmentSteps = new DoubleBuffer(options.KeepDenseOutput ? 1024 : 0);
        var segmentCoefficients = new DoubleBuffer(options.KeepDenseOutput ? 1024 * 5 * dimension : 0);
        var occurrences = new List<OdeEventOccurrence>();
        var finalValues = stepper.AugmentedState.ToArray();
        var finalTime = problem.StartTime;
        var status = SolveStatus.Succeeded;

        if (keepSteps)
        {
            stepTimes.Add(stepper.Time);
            stepValues.Add(stepper.AugmentedState);
        }

        while (sampleTimes is not null && samplesDone < sampleTimes.Length && sampleTimes[samplesDone] == problem.StartTime)
        {
            stepper.AugmentedState.CopyTo(sampleValues.AsSpan(samplesDone++ * dimension, dimension));
        }

        var stoppedByEvent = false;
        var stepsSinceCheck = 0;
        while (stepper.Step())
        {
            if (++stepsSinceCheck == DormandPrince45.CancellationCheckSteps)
            {
                options.Cancellation.ThrowIfCancellationRequested();
                stepsSinceCheck = 0;
            }

            var reached = stepper.Time;
            if (events?.CheckLastStep() is { } stopTime)
            {
                reached = stopTime;
                stoppedByEvent = true;
            }

            if (events is not null)
            {
                occurrences.AddRange(events.FoundInLastStep);
            }

            while (sampleTimes is not null && samplesDone < sampleTimes.Length && direction * (sampleTimes[samplesDone] - reached) <= 0)
            {
                stepper.InterpolateLastStep(sampleTimes[samplesDone], sampleValues.AsSpan(samplesDone * dimension, dimension));
                samplesDone++;
            }

            if (options.KeepDenseOutput)
            {
                segmentStarts.Add(stepper.PreviousTime);
                segmentSteps.Add(stepper.LastStepSize);
                segmentCoefficients.Add(stepper.LastStepCoefficients());
            }

            finalTime = reached;
            if (stoppedByEvent)
            {
                stepper.InterpolateLastStep(reached, finalValues);
            }
            else
            {
                stepper.AugmentedState.CopyTo(finalValues);
            }

            if (keepSteps)
            {
                stepTimes.Add(finalTime);
                stepValues.Add(finalValues);
            }

            if (stoppedByEvent)
            {
                status = SolveStatus.StoppedByEvent;
                break;
            }
        }

        if (!stoppedByEvent)
        {
            status = stepper.Status;
            finalTime = stepper.Time;
            stepper.AugmentedState.CopyTo(finalValues);
        }

        var times = sampleTimes is null ? stepTimes.ToArray() : samplesDone == sampleTimes.Length ? sampleTimes : sampleTimes[..samplesDone];
        var values = sampleTimes is null ? stepValues.ToArray()
            : samplesDone == sampleTimes.Length ? sampleValues : sampleValues.AsSpan(0, samplesDone * dimension).ToArray();
        return new OdeSolution(
            status,
            OdeSolver.Describe(status, finalTime, options),
            stepper.Statistics,
            stepper.StateCount,
            stepper.ParameterCount,
            stepper.HasSensitivities,
            problem.StartTime,
            finalTime,
            finalValues,
            times,
            values,
            occurrences,
            options.KeepDenseOutput,
            segmentStarts.ToArray(),
            segmentSteps.ToArray(),
            segmentCoefficients.ToArray());
    }
}
