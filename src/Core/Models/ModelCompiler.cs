using System.Reflection;
using System.Reflection.Emit;
using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Models;

/// <summary>The shape of a compiled kernel: reads t, the state and the parameters, writes its outputs.</summary>
/// <param name="time">t.</param>
/// <param name="state">The first state entry.</param>
/// <param name="parameters">The first parameter entry (not read when there are none).</param>
/// <param name="output">The first output entry.</param>
internal delegate void ModelKernel(double time, ref double state, ref double parameters, ref double output);

/// <summary>The three kernels of one model and the expressions they compute.</summary>
internal sealed record CompiledKernels(
    DynamicMethod RightHandSide,
    DynamicMethod StateJacobian,
    DynamicMethod ParameterJacobian,
    IReadOnlyList<Expression> RightHandSides,
    IReadOnlyList<Expression> StateJacobianEntries,
    IReadOnlyList<Expression> ParameterJacobianEntries);

/// <summary>Compiles a model's right-hand side and its symbolic Jacobians to IL, once.</summary>
/// <remarks>
/// <para>Each kernel is a <see cref="DynamicMethod"/> with the signature
/// (SampledSignal[] inputs, double t, ref double x, ref double p, ref double output): straight-line
/// code that loads x_i and p_k through the managed pointers, computes every output with repeated
/// subexpressions evaluated once into locals, and stores the results. The pointers come from
/// <c>MemoryMarshal.GetReference</c> after <see cref="CompiledModel"/> has checked the span lengths,
/// so no access can fall outside the caller's buffers.</para>
/// <para>The arithmetic is the same as <see cref="ExpressionEvaluator"/>'s, operation for operation.</para>
/// </remarks>
internal static class ModelCompiler
{
    private static readonly Type[] KernelParameters =
        [typeof(SampledSignal[]), typeof(double), typeof(double).MakeByRefType(), typeof(double).MakeByRefType(), typeof(double).MakeByRefType()];

    public static CompiledModel Compile(EquationModel model, IReadOnlyList<SampledSignal> inputs)
    {
        var n = model.States.Count;
        var m = model.Parameters.Count;
        var rightHandSides = model.Equations.Select(equation => Lower(equation.RightHandSide)).ToArray();
        var stateJacobian = new Expression[n * n];
        var parameterJacobian = new Expression[n * m];
        for (var i = 0; i < n; i++)
        {
            for (var j = 0; j < n; j++)
            {
                stateJacobian[(i * n) + j] = Lower(ExpressionDifferentiator.Differentiate(rightHandSides[i], new StateExpression(model.States[j].Name, j)));
            }

            for (var k = 0; k < m; k++)
            {
                parameterJacobian[(i * m) + k] = Lower(ExpressionDifferentiator.Differentiate(rightHandSides[i], new ParameterExpression(model.Parameters[k].Name, k)));
            }
        }

        var kernels = new CompiledKernels(
            Emit("RightHandSide", rightHandSides),
            Emit("StateJacobian", stateJacobian),
            Emit("ParameterJacobian", parameterJacobian),
            rightHandSides,
            stateJacobian,
            parameterJacobian);
        return new CompiledModel(model, kernels, [.. inputs]);
    }

    public static ModelKernel Bind(DynamicMethod method, SampledSignal[] inputs) =>
        (ModelKernel)method.CreateDelegate(typeof(ModelKernel), inputs);

    /// <summary>Replaces piecewise-linear calls by their segment sums and simplifies.</summary>
    private static Expression Lower(Expression expression)
    {
        Expression Rewrite(Expression node) => node switch
        {
            PiecewiseLinearExpression piecewise => piecewise.Function.Expand(Rewrite(piecewise.Argument)),
            NegateExpression negate => new NegateExpression(Rewrite(negate.Operand)),
            BinaryExpression binary => binary with { Left = Rewrite(binary.Left), Right = Rewrite(binary.Right) },
            CallExpression call => call with { Argument = Rewrite(call.Argument), SecondArgument = call.SecondArgument is null ? null : Rewrite(call.SecondArgument) },
            SegmentExpression segment => segment with { Argument = Rewrite(segment.Argument) },
            WindowExpression window => window with { Argument = Rewrite(window.Argument) },
            ChooseExpression choose => new ChooseExpression(Rewrite(choose.Left), Rewrite(choose.Right), Rewrite(choose.WhenLessOrEqual), Rewrite(choose.Otherwise)),
            _ => node,
        };

        return ExpressionSimplifier.Simplify(Rewrite(expression));
    }

    private static DynamicMethod Emit(string name, IReadOnlyList<Expression> outputs)
    {
        var method = new DynamicMethod(name, typeof(void), KernelParameters, typeof(ModelCompiler).Module, skipVisibility: true);
        var il = method.GetILGenerator();
        var emitter = new KernelEmitter(il, outputs);
        for (var i = 0; i < outputs.Count; i++)
        {
            il.Emit(OpCodes.Ldarg_S, (byte)4);
            EmitOffset(il, i);
            emitter.EmitValue(outputs[i]);
            il.Emit(OpCodes.Stind_R8);
        }

        il.Emit(OpCodes.Ret);
        return method;
    }

    private static void EmitOffset(ILGenerator il, int index)
    {
        if (index > 0)
        {
            il.Emit(OpCodes.Ldc_I4, index * sizeof(double));
            il.Emit(OpCodes.Add);
        }
    }

    /// <summary>Emits expression values, computing each repeated subexpression once.</summary>
    private sealed class KernelEmitter
    {
        private static readonly MethodInfo ValueAt = typeof(SampledSignal).GetMethod(nameof(SampledSignal.ValueAt))!;
        private static readonly MethodInfo Power = typeof(ModelMath).GetMethod(nameof(ModelMath.Power))!;
        private static readonly MethodInfo Segment = typeof(ModelMath).GetMethod(nameof(ModelMath.Segment))!;
        private static readonly MethodInfo Window = typeof(ModelMath).GetMethod(nameof(ModelMath.Window))!;
        private static readonly MethodInfo Choose = typeof(ModelMath).GetMethod(nameof(ModelMath.Choose))!;

        private readonly ILGenerator il;
        private readonly Dictionary<Expression, int> occurrences = [];
        private readonly Dictionary<Expression, LocalBuilder> computed = [];

        public KernelEmitter(ILGenerator il, IReadOnlyList<Expression> outputs)
        {
            this.il = il;
            foreach (var output in outputs)
            {
                Count(output);
            }
        }

        private static bool IsLeaf(Expression expression) =>
            expression is NumberExpression or StateExpression or ParameterExpression or ConstantExpression or TimeExpression;

        private void Count(Expression expression)
        {
            if (IsLeaf(expression))
            {
                return;
            }

            occurrences[expression] = occurrences.GetValueOrDefault(expression) + 1;
            if (occurrences[expression] == 1)
            {
                foreach (var child in expression.Children)
                {
                    Count(child);
                }
            }
        }

        public void EmitValue(Expression expression)
        {
            if (computed.TryGetValue(expression, out var local))
            {
                il.Emit(OpCodes.Ldloc, local);
                return;
            }

            EmitNode(expression);
            if (!IsLeaf(expression) && occurrences.GetValueOrDefault(expression) > 1)
            {
                var stored = il.DeclareLocal(typeof(double));
                il.Emit(OpCodes.Dup);
                il.Emit(OpCodes.Stloc, stored);
                computed[expression] = stored;
            }
        }

        private void EmitNode(Expression expression)
        {
            switch (expression)
            {
                case NumberExpression number:
                    il.Emit(OpCodes.Ldc_R8, number.Value);
                    break;
                case ConstantExpression constant:
                    il.Emit(OpCodes.Ldc_R8, constant.Value);
                    break;
                case StateExpression state:
                    il.Emit(OpCodes.Ldarg_2);
                    EmitOffset(il, state.Index);
                    il.Emit(OpCodes.Ldind_R8);
                    break;
                case ParameterExpression parameter:
                    il.Emit(OpCodes.Ldarg_3);
                    EmitOffset(il, parameter.Index);
                    il.Emit(OpCodes.Ldind_R8);
                    break;
                case TimeExpression:
                    il.Emit(OpCodes.Ldarg_1);
                    break;
                case InputExpression input:
                    il.Emit(OpCodes.Ldarg_0);
                    il.Emit(OpCodes.Ldc_I4, input.Index);
                    il.Emit(OpCodes.Ldelem_Ref);
                    il.Emit(OpCodes.Ldarg_1);
                    il.Emit(OpCodes.Callvirt, ValueAt);
                    break;
                case NegateExpression negate:
                    EmitValue(negate.Operand);
                    il.Emit(OpCodes.Neg);
                    break;
                case BinaryExpression binary:
                    EmitBinary(binary);
                    break;
                case CallExpression call:
                    EmitValue(call.Argument);
                    if (call.SecondArgument is not null)
                    {
                        EmitValue(call.SecondArgument);
                    }

                    il.Emit(OpCodes.Call, MethodOf(call.Function));
                    break;
                case SegmentExpression segment:
                    il.Emit(OpCodes.Ldc_R8, segment.Lower);
                    il.Emit(OpCodes.Ldc_R8, segment.Upper);
                    EmitValue(segment.Argument);
                    il.Emit(OpCodes.Call, Segment);
                    break;
                case WindowExpression window:
                    il.Emit(OpCodes.Ldc_R8, window.Lower);
                    il.Emit(OpCodes.Ldc_R8, window.Upper);
                    EmitValue(window.Argument);
                    il.Emit(OpCodes.Call, Window);
                    break;
                case ChooseExpression choose:
                    EmitValue(choose.Left);
                    EmitValue(choose.Right);
                    EmitValue(choose.WhenLessOrEqual);
                    EmitValue(choose.Otherwise);
                    il.Emit(OpCodes.Call, Choose);
                    break;
                default:
                    throw new InvalidOperationException("Cannot compile expression node " + expression.GetType().Name);
            }
        }

        private void EmitBinary(BinaryExpression binary)
        {
            if (binary.Operator == BinaryOperator.Power)
            {
                if (binary.Right is NumberExpression { Value: 2.0 })
                {
                    EmitValue(binary.Left);
                    il.Emit(OpCodes.Dup);
                    il.Emit(OpCodes.Mul);
                    return;
                }

                if (binary.Right is NumberExpression { Value: 3.0 })
                {
                    var cube = il.DeclareLocal(typeof(double));
                    EmitValue(binary.Left);
                    il.Emit(OpCodes.Stloc, cube);
                    il.Emit(OpCodes.Ldloc, cube);
                    il.Emit(OpCodes.Ldloc, cube);
                    il.Emit(OpCodes.Mul);
                    il.Emit(OpCodes.Ldloc, cube);
                    il.Emit(OpCodes.Mul);
                    return;
                }

                EmitValue(binary.Left);
                EmitValue(binary.Right);
                il.Emit(OpCodes.Call, Power);
                return;
            }

            EmitValue(binary.Left);
            EmitValue(binary.Right);
            il.Emit(binary.Operator switch
            {
                BinaryOperator.Add => OpCodes.Add,
                BinaryOperator.Subtract => OpCodes.Sub,
                BinaryOperator.Multiply => OpCodes.Mul,
                _ => OpCodes.Div,
            });
        }

        private static MethodInfo MethodOf(MathFunction function)
        {
            var (type, name, arity) = function switch
            {
                MathFunction.Abs => (typeof(Math), nameof(Math.Abs), 1),
                MathFunction.Sign => (typeof(ModelMath), nameof(ModelMath.Sign), 1),
                MathFunction.Min => (typeof(ModelMath), nameof(ModelMath.Min), 2),
                MathFunction.Max => (typeof(ModelMath), nameof(ModelMath.Max), 2),
                MathFunction.Exp => (typeof(Math), nameof(Math.Exp), 1),
                MathFunction.Log => (typeof(Math), nameof(Math.Log), 1),
                MathFunction.Sqrt => (typeof(Math), nameof(Math.Sqrt), 1),
                MathFunction.Sin => (typeof(Math), nameof(Math.Sin), 1),
                MathFunction.Cos => (typeof(Math), nameof(Math.Cos), 1),
                _ => (typeof(Math), nameof(Math.Tanh), 1),
            };
            return type.GetMethod(name, arity == 1 ? [typeof(double)] : [typeof(double), typeof(double)])!;
        }
    }
}
