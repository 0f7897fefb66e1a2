using Patchproof.Core.Simulation;

namespace Patchproof.Core.Tests.Simulation;

public sealed class StepSizeControllerTests
{
    private static readonly StepSizeController Controller = new();

    [Fact]
    public void ProposeFactor_Defaults_AreThoseOfDopri5()
    {
        // Hairer et al. 1993, code DOPRI5: SAFE 0.9, FAC1 0.2, FAC2 10, BETA 0.04, EXPO1 = 0.2 - 0.75 BETA.
        Assert.Equal(0.9, Controller.Safety);
        Assert.Equal(0.2, Controller.MinFactor);
        Assert.Equal(10.0, Controller.MaxFactor);
        Assert.Equal(0.04, Controller.Beta);
        Assert.Equal(0.17, Controller.Alpha, 1e-15);
    }

    [Fact]
    public void ProposeFactor_AcceptedStep_FollowsThePiFormula()
    {
        var factor = Controller.ProposeFactor(0.5, 0.3, previousStepRejected: false);

        Assert.Equal(0.9 * Math.Pow(0.5, -0.17) * Math.Pow(0.3, 0.04), factor, 1e-15);
    }

    [Fact]
    public void ProposeFactor_RejectedStep_ShrinksButNotBelowMinFactor()
    {
        Assert.Equal(0.9 * Math.Pow(2.0, -0.17), Controller.ProposeFactor(2.0, 0.3, false), 1e-15);
        Assert.Equal(0.2, Controller.ProposeFactor(1e9, 0.3, false));
    }

    [Fact]
    public void ProposeFactor_AfterRejection_DoesNotGrow()
    {
        Assert.Equal(1.0, Controller.ProposeFactor(1e-6, 0.3, previousStepRejected: true));
        Assert.Equal(10.0, Controller.ProposeFactor(1e-12, 1e-4, previousStepRejected: false));
    }

    [Fact]
    public void Solve_InvalidController_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new DormandPrince45 { Controller = new StepSizeController { MinFactor = 2 } }.Validate());
    }
}
