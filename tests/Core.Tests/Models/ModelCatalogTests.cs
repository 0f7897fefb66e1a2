using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Models;

public sealed class ModelCatalogTests
{
    [Fact]
    public void All_HasTheEightBuiltInModels()
    {
        Assert.Equal(
            ["lorenz", "rossler", "chua", "van-der-pol", "duffing", "damped-oscillator", "sprott-jerk", "lotka-volterra"],
            ModelCatalog.All.Select(model => model.Name));
        Assert.Same(ModelCatalog.VanDerPol, ModelCatalog.Find("Van-der-Pol"));
        Assert.Null(ModelCatalog.Find("no-such-model"));
    }

    [Theory]
    [MemberData(nameof(CompiledModelTests.BuiltInNames), MemberType = typeof(CompiledModelTests))]
    public void BuiltIn_TextAndHandWrittenTwin_Agree(string name)
    {
        // Arrange
        var builtIn = ModelCatalog.Find(name)!;
        var result = ModelParser.Parse(builtIn.EquationText, name);

        // Assert: the text parses cleanly and describes the hand-written system's shape.
        Assert.True(result.Success, string.Join("\n", result.Errors));
        Assert.Empty(result.Warnings);
        var model = result.Value;
        Assert.Equal(builtIn.HandWritten.StateNames, model.StateNames);
        Assert.Equal(builtIn.HandWritten.ParameterNames, model.ParameterNames);
        Assert.Equal(builtIn.DefaultInitialState, model.DefaultInitialState());
        Assert.True(builtIn.SuggestedDuration > 0);
        Assert.False(string.IsNullOrWhiteSpace(builtIn.Source));
        Assert.False(string.IsNullOrWhiteSpace(builtIn.Description));
    }

    [Theory]
    [InlineData("lorenz", new[] { 10.0, 28.0, 8.0 / 3.0 })] // Lorenz 1963
    [InlineData("rossler", new[] { 0.2, 0.2, 5.7 })] // Sprott, Common Chaotic Systems
    [InlineData("chua", new[] { 15.6, 28.0 })] // alpha, beta as listed on public demonstration pages
    [InlineData("van-der-pol", new[] { 1.0 })]
    [InlineData("duffing", new[] { 0.3, -1.0, 1.0, 0.5 })] // from memory (Guckenheimer and Holmes)
    [InlineData("damped-oscillator", new[] { 0.1, 2 * Math.PI })] // project check values
    [InlineData("sprott-jerk", new[] { 2.017 })] // Sprott 1997
    [InlineData("lotka-volterra", new[] { 2.0 / 3.0, 4.0 / 3.0, 1.0, 1.0 })] // textbook example set
    public void NominalParameters_AreThePublishedValues(string name, double[] expected)
    {
        Assert.Equal(expected, ModelCatalog.Find(name)!.NominalParameters());
    }

    [Fact]
    public void Chua_DiodeConstants_AreTheSlopesMinus8Over7AndMinus5Over7()
    {
        var model = ModelCatalog.Chua.Parse();

        Assert.Equal([new ModelConstant("m0", -8.0 / 7.0, 5), new ModelConstant("m1", -5.0 / 7.0, 6)], model.Constants);
        Assert.Equal(-1.143, model.Constants[0].Value, 3);
        Assert.Equal(-0.714, model.Constants[1].Value, 3);
    }

    [Theory]
    [MemberData(nameof(CompiledModelTests.BuiltInNames), MemberType = typeof(CompiledModelTests))]
    public void DefaultInitialState_StaysBoundedOverTheSuggestedDuration(string name)
    {
        // Arrange: classical RK4 with a small fixed step, enough to tell a bounded orbit from a blow-up.
        var builtIn = ModelCatalog.Find(name)!;
        var system = builtIn.HandWritten;
        var parameters = builtIn.NominalParameters();
        var n = system.StateCount;
        var state = builtIn.DefaultInitialState.ToArray();
        var (k1, k2, k3, k4, stage) = (new double[n], new double[n], new double[n], new double[n], new double[n]);
        const double step = 0.002;
        var largest = 0.0;

        // Act
        for (var i = 0; i * step < builtIn.SuggestedDuration; i++)
        {
            var t = i * step;
            system.Evaluate(t, state, parameters, k1);
            for (var j = 0; j < n; j++) { stage[j] = state[j] + (0.5 * step * k1[j]); }
            system.Evaluate(t + (0.5 * step), stage, parameters, k2);
            for (var j = 0; j < n; j++) { stage[j] = state[j] + (0.5 * step * k2[j]); }
            system.Evaluate(t + (0.5 * step), stage, parameters, k3);
            for (var j = 0; j < n; j++) { stage[j] = state[j] + (step * k3[j]); }
            system.Evaluate(t + step, stage, parameters, k4);
            for (var j = 0; j < n; j++)
            {
                state[j] += step / 6 * (k1[j] + (2 * k2[j]) + (2 * k3[j]) + k4[j]);
                largest = Math.Max(largest, Math.Abs(state[j]));
            }
        }

        // Assert
        Assert.True(double.IsFinite(largest) && largest < 100, $"{name} reached {largest}");
        Assert.True(largest > 0.1, $"{name} barely moved ({largest})");
    }
}
