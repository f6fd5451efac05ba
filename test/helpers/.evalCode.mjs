var __create = Object.create;
var __defProp = Object.defineProperty;
var __getOwnPropDesc = Object.getOwnPropertyDescriptor;
var __getOwnPropNames = Object.getOwnPropertyNames;
var __getProtoOf = Object.getPrototypeOf;
var __hasOwnProp = Object.prototype.hasOwnProperty;
var __commonJS = (cb, mod) => function __require() {
  try {
    return mod || (0, cb[__getOwnPropNames(cb)[0]])((mod = { exports: {} }).exports, mod), mod.exports;
  } catch (e) {
    throw mod = 0, e;
  }
};
var __copyProps = (to, from, except, desc) => {
  if (from && typeof from === "object" || typeof from === "function") {
    for (let key of __getOwnPropNames(from))
      if (!__hasOwnProp.call(to, key) && key !== except)
        __defProp(to, key, { get: () => from[key], enumerable: !(desc = __getOwnPropDesc(from, key)) || desc.enumerable });
  }
  return to;
};
var __toESM = (mod, isNodeMode, target) => (target = mod != null ? __create(__getProtoOf(mod)) : {}, __copyProps(
  // If the importer is in node compatibility mode or this is not an ESM
  // file that has been converted to a CommonJS file using a Babel-
  // compatible transform (i.e. "__esModule" has not been set), then set
  // "default" to the CommonJS "module.exports" for node compatibility.
  isNodeMode || !mod || !mod.__esModule ? __defProp(target, "default", { value: mod, enumerable: true }) : target,
  mod
));

// node_modules/ml-matrix/matrix.js
var require_matrix = __commonJS({
  "node_modules/ml-matrix/matrix.js"(exports) {
    "use strict";
    Object.defineProperty(exports, "__esModule", { value: true });
    var toString = Object.prototype.toString;
    function isAnyArray(value) {
      const tag = toString.call(value);
      return tag.endsWith("Array]") && !tag.includes("Big");
    }
    function max(input, options = {}) {
      if (!isAnyArray(input)) {
        throw new TypeError("input must be an array");
      }
      if (input.length === 0) {
        throw new TypeError("input must not be empty");
      }
      const { fromIndex = 0, toIndex = input.length } = options;
      if (fromIndex < 0 || fromIndex >= input.length || !Number.isInteger(fromIndex)) {
        throw new Error("fromIndex must be a positive integer smaller than length");
      }
      if (toIndex <= fromIndex || toIndex > input.length || !Number.isInteger(toIndex)) {
        throw new Error("toIndex must be an integer greater than fromIndex and at most equal to length");
      }
      let maxValue = input[fromIndex];
      for (let i = fromIndex + 1; i < toIndex; i++) {
        if (input[i] > maxValue)
          maxValue = input[i];
      }
      return maxValue;
    }
    function min(input, options = {}) {
      if (!isAnyArray(input)) {
        throw new TypeError("input must be an array");
      }
      if (input.length === 0) {
        throw new TypeError("input must not be empty");
      }
      const { fromIndex = 0, toIndex = input.length } = options;
      if (fromIndex < 0 || fromIndex >= input.length || !Number.isInteger(fromIndex)) {
        throw new Error("fromIndex must be a positive integer smaller than length");
      }
      if (toIndex <= fromIndex || toIndex > input.length || !Number.isInteger(toIndex)) {
        throw new Error("toIndex must be an integer greater than fromIndex and at most equal to length");
      }
      let minValue = input[fromIndex];
      for (let i = fromIndex + 1; i < toIndex; i++) {
        if (input[i] < minValue)
          minValue = input[i];
      }
      return minValue;
    }
    function rescale(input, options = {}) {
      if (!isAnyArray(input)) {
        throw new TypeError("input must be an array");
      } else if (input.length === 0) {
        throw new TypeError("input must not be empty");
      }
      let output;
      if (options.output !== void 0) {
        if (!isAnyArray(options.output)) {
          throw new TypeError("output option must be an array if specified");
        }
        output = options.output;
      } else {
        output = new Array(input.length);
      }
      const currentMin = min(input);
      const currentMax = max(input);
      if (currentMin === currentMax) {
        throw new RangeError("minimum and maximum input values are equal. Cannot rescale a constant array");
      }
      const { min: minValue = options.autoMinMax ? currentMin : 0, max: maxValue = options.autoMinMax ? currentMax : 1 } = options;
      if (minValue >= maxValue) {
        throw new RangeError("min option must be smaller than max option");
      }
      const factor = (maxValue - minValue) / (currentMax - currentMin);
      for (let i = 0; i < input.length; i++) {
        output[i] = (input[i] - currentMin) * factor + minValue;
      }
      return output;
    }
    var indent = " ".repeat(2);
    var indentData = " ".repeat(4);
    function inspectMatrix() {
      return inspectMatrixWithOptions(this);
    }
    function inspectMatrixWithOptions(matrix2, options = {}) {
      const {
        maxRows = 15,
        maxColumns = 10,
        maxNumSize = 8,
        padMinus = "auto"
      } = options;
      return `${matrix2.constructor.name} {
${indent}[
${indentData}${inspectData(matrix2, maxRows, maxColumns, maxNumSize, padMinus)}
${indent}]
${indent}rows: ${matrix2.rows}
${indent}columns: ${matrix2.columns}
}`;
    }
    function inspectData(matrix2, maxRows, maxColumns, maxNumSize, padMinus) {
      const { rows, columns } = matrix2;
      const maxI = Math.min(rows, maxRows);
      const maxJ = Math.min(columns, maxColumns);
      const result = [];
      if (padMinus === "auto") {
        padMinus = false;
        loop: for (let i = 0; i < maxI; i++) {
          for (let j = 0; j < maxJ; j++) {
            if (matrix2.get(i, j) < 0) {
              padMinus = true;
              break loop;
            }
          }
        }
      }
      for (let i = 0; i < maxI; i++) {
        let line = [];
        for (let j = 0; j < maxJ; j++) {
          line.push(formatNumber(matrix2.get(i, j), maxNumSize, padMinus));
        }
        result.push(`${line.join(" ")}`);
      }
      if (maxJ !== columns) {
        result[result.length - 1] += ` ... ${columns - maxColumns} more columns`;
      }
      if (maxI !== rows) {
        result.push(`... ${rows - maxRows} more rows`);
      }
      return result.join(`
${indentData}`);
    }
    function formatNumber(num, maxNumSize, padMinus) {
      return (num >= 0 && padMinus ? ` ${formatNumber2(num, maxNumSize - 1)}` : formatNumber2(num, maxNumSize)).padEnd(maxNumSize);
    }
    function formatNumber2(num, len) {
      let str = num.toString();
      if (str.length <= len) return str;
      let fix = num.toFixed(len);
      if (fix.length > len) {
        fix = num.toFixed(Math.max(0, len - (fix.length - len)));
      }
      if (fix.length <= len && !fix.startsWith("0.000") && !fix.startsWith("-0.000")) {
        return fix;
      }
      let exp = num.toExponential(len);
      if (exp.length > len) {
        exp = num.toExponential(Math.max(0, len - (exp.length - len)));
      }
      return exp.slice(0);
    }
    function installMathOperations(AbstractMatrix3, Matrix4) {
      AbstractMatrix3.prototype.add = function add(value) {
        if (typeof value === "number") return this.addS(value);
        return this.addM(value);
      };
      AbstractMatrix3.prototype.addS = function addS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) + value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.addM = function addM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) + matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.add = function add(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.add(value);
      };
      AbstractMatrix3.prototype.sub = function sub(value) {
        if (typeof value === "number") return this.subS(value);
        return this.subM(value);
      };
      AbstractMatrix3.prototype.subS = function subS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) - value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.subM = function subM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) - matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.sub = function sub(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.sub(value);
      };
      AbstractMatrix3.prototype.subtract = AbstractMatrix3.prototype.sub;
      AbstractMatrix3.prototype.subtractS = AbstractMatrix3.prototype.subS;
      AbstractMatrix3.prototype.subtractM = AbstractMatrix3.prototype.subM;
      AbstractMatrix3.subtract = AbstractMatrix3.sub;
      AbstractMatrix3.prototype.mul = function mul(value) {
        if (typeof value === "number") return this.mulS(value);
        return this.mulM(value);
      };
      AbstractMatrix3.prototype.mulS = function mulS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) * value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.mulM = function mulM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) * matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.mul = function mul(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.mul(value);
      };
      AbstractMatrix3.prototype.multiply = AbstractMatrix3.prototype.mul;
      AbstractMatrix3.prototype.multiplyS = AbstractMatrix3.prototype.mulS;
      AbstractMatrix3.prototype.multiplyM = AbstractMatrix3.prototype.mulM;
      AbstractMatrix3.multiply = AbstractMatrix3.mul;
      AbstractMatrix3.prototype.div = function div(value) {
        if (typeof value === "number") return this.divS(value);
        return this.divM(value);
      };
      AbstractMatrix3.prototype.divS = function divS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) / value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.divM = function divM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) / matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.div = function div(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.div(value);
      };
      AbstractMatrix3.prototype.divide = AbstractMatrix3.prototype.div;
      AbstractMatrix3.prototype.divideS = AbstractMatrix3.prototype.divS;
      AbstractMatrix3.prototype.divideM = AbstractMatrix3.prototype.divM;
      AbstractMatrix3.divide = AbstractMatrix3.div;
      AbstractMatrix3.prototype.mod = function mod(value) {
        if (typeof value === "number") return this.modS(value);
        return this.modM(value);
      };
      AbstractMatrix3.prototype.modS = function modS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) % value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.modM = function modM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) % matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.mod = function mod(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.mod(value);
      };
      AbstractMatrix3.prototype.modulus = AbstractMatrix3.prototype.mod;
      AbstractMatrix3.prototype.modulusS = AbstractMatrix3.prototype.modS;
      AbstractMatrix3.prototype.modulusM = AbstractMatrix3.prototype.modM;
      AbstractMatrix3.modulus = AbstractMatrix3.mod;
      AbstractMatrix3.prototype.and = function and(value) {
        if (typeof value === "number") return this.andS(value);
        return this.andM(value);
      };
      AbstractMatrix3.prototype.andS = function andS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) & value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.andM = function andM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) & matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.and = function and(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.and(value);
      };
      AbstractMatrix3.prototype.or = function or(value) {
        if (typeof value === "number") return this.orS(value);
        return this.orM(value);
      };
      AbstractMatrix3.prototype.orS = function orS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) | value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.orM = function orM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) | matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.or = function or(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.or(value);
      };
      AbstractMatrix3.prototype.xor = function xor(value) {
        if (typeof value === "number") return this.xorS(value);
        return this.xorM(value);
      };
      AbstractMatrix3.prototype.xorS = function xorS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) ^ value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.xorM = function xorM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) ^ matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.xor = function xor(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.xor(value);
      };
      AbstractMatrix3.prototype.leftShift = function leftShift(value) {
        if (typeof value === "number") return this.leftShiftS(value);
        return this.leftShiftM(value);
      };
      AbstractMatrix3.prototype.leftShiftS = function leftShiftS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) << value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.leftShiftM = function leftShiftM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) << matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.leftShift = function leftShift(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.leftShift(value);
      };
      AbstractMatrix3.prototype.signPropagatingRightShift = function signPropagatingRightShift(value) {
        if (typeof value === "number") return this.signPropagatingRightShiftS(value);
        return this.signPropagatingRightShiftM(value);
      };
      AbstractMatrix3.prototype.signPropagatingRightShiftS = function signPropagatingRightShiftS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) >> value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.signPropagatingRightShiftM = function signPropagatingRightShiftM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) >> matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.signPropagatingRightShift = function signPropagatingRightShift(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.signPropagatingRightShift(value);
      };
      AbstractMatrix3.prototype.rightShift = function rightShift(value) {
        if (typeof value === "number") return this.rightShiftS(value);
        return this.rightShiftM(value);
      };
      AbstractMatrix3.prototype.rightShiftS = function rightShiftS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) >>> value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.rightShiftM = function rightShiftM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) >>> matrix2.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.rightShift = function rightShift(matrix2, value) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.rightShift(value);
      };
      AbstractMatrix3.prototype.zeroFillRightShift = AbstractMatrix3.prototype.rightShift;
      AbstractMatrix3.prototype.zeroFillRightShiftS = AbstractMatrix3.prototype.rightShiftS;
      AbstractMatrix3.prototype.zeroFillRightShiftM = AbstractMatrix3.prototype.rightShiftM;
      AbstractMatrix3.zeroFillRightShift = AbstractMatrix3.rightShift;
      AbstractMatrix3.prototype.not = function not() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, ~this.get(i, j));
          }
        }
        return this;
      };
      AbstractMatrix3.not = function not(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.not();
      };
      AbstractMatrix3.prototype.abs = function abs() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.abs(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.abs = function abs(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.abs();
      };
      AbstractMatrix3.prototype.acos = function acos() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.acos(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.acos = function acos(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.acos();
      };
      AbstractMatrix3.prototype.acosh = function acosh() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.acosh(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.acosh = function acosh(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.acosh();
      };
      AbstractMatrix3.prototype.asin = function asin() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.asin(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.asin = function asin(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.asin();
      };
      AbstractMatrix3.prototype.asinh = function asinh() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.asinh(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.asinh = function asinh(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.asinh();
      };
      AbstractMatrix3.prototype.atan = function atan() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.atan(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.atan = function atan(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.atan();
      };
      AbstractMatrix3.prototype.atanh = function atanh() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.atanh(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.atanh = function atanh(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.atanh();
      };
      AbstractMatrix3.prototype.cbrt = function cbrt() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.cbrt(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.cbrt = function cbrt(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.cbrt();
      };
      AbstractMatrix3.prototype.ceil = function ceil() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.ceil(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.ceil = function ceil(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.ceil();
      };
      AbstractMatrix3.prototype.clz32 = function clz32() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.clz32(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.clz32 = function clz32(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.clz32();
      };
      AbstractMatrix3.prototype.cos = function cos() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.cos(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.cos = function cos(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.cos();
      };
      AbstractMatrix3.prototype.cosh = function cosh() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.cosh(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.cosh = function cosh(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.cosh();
      };
      AbstractMatrix3.prototype.exp = function exp() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.exp(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.exp = function exp(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.exp();
      };
      AbstractMatrix3.prototype.expm1 = function expm1() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.expm1(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.expm1 = function expm1(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.expm1();
      };
      AbstractMatrix3.prototype.floor = function floor() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.floor(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.floor = function floor(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.floor();
      };
      AbstractMatrix3.prototype.fround = function fround() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.fround(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.fround = function fround(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.fround();
      };
      AbstractMatrix3.prototype.log = function log() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.log(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.log = function log(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.log();
      };
      AbstractMatrix3.prototype.log1p = function log1p() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.log1p(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.log1p = function log1p(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.log1p();
      };
      AbstractMatrix3.prototype.log10 = function log10() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.log10(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.log10 = function log10(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.log10();
      };
      AbstractMatrix3.prototype.log2 = function log2() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.log2(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.log2 = function log2(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.log2();
      };
      AbstractMatrix3.prototype.round = function round() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.round(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.round = function round(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.round();
      };
      AbstractMatrix3.prototype.sign = function sign() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.sign(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.sign = function sign(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.sign();
      };
      AbstractMatrix3.prototype.sin = function sin() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.sin(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.sin = function sin(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.sin();
      };
      AbstractMatrix3.prototype.sinh = function sinh() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.sinh(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.sinh = function sinh(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.sinh();
      };
      AbstractMatrix3.prototype.sqrt = function sqrt() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.sqrt(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.sqrt = function sqrt(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.sqrt();
      };
      AbstractMatrix3.prototype.tan = function tan() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.tan(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.tan = function tan(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.tan();
      };
      AbstractMatrix3.prototype.tanh = function tanh() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.tanh(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.tanh = function tanh(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.tanh();
      };
      AbstractMatrix3.prototype.trunc = function trunc() {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, Math.trunc(this.get(i, j)));
          }
        }
        return this;
      };
      AbstractMatrix3.trunc = function trunc(matrix2) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.trunc();
      };
      AbstractMatrix3.pow = function pow(matrix2, arg0) {
        const newMatrix = new Matrix4(matrix2);
        return newMatrix.pow(arg0);
      };
      AbstractMatrix3.prototype.pow = function pow(value) {
        if (typeof value === "number") return this.powS(value);
        return this.powM(value);
      };
      AbstractMatrix3.prototype.powS = function powS(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) ** value);
          }
        }
        return this;
      };
      AbstractMatrix3.prototype.powM = function powM(matrix2) {
        matrix2 = Matrix4.checkMatrix(matrix2);
        if (this.rows !== matrix2.rows || this.columns !== matrix2.columns) {
          throw new RangeError("Matrices dimensions must be equal");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) ** matrix2.get(i, j));
          }
        }
        return this;
      };
    }
    function checkRowIndex(matrix2, index2, outer) {
      let max2 = outer ? matrix2.rows : matrix2.rows - 1;
      if (index2 < 0 || index2 > max2) {
        throw new RangeError("Row index out of range");
      }
    }
    function checkColumnIndex(matrix2, index2, outer) {
      let max2 = outer ? matrix2.columns : matrix2.columns - 1;
      if (index2 < 0 || index2 > max2) {
        throw new RangeError("Column index out of range");
      }
    }
    function checkRowVector(matrix2, vector) {
      if (vector.to1DArray) {
        vector = vector.to1DArray();
      }
      if (vector.length !== matrix2.columns) {
        throw new RangeError(
          "vector size must be the same as the number of columns"
        );
      }
      return vector;
    }
    function checkColumnVector(matrix2, vector) {
      if (vector.to1DArray) {
        vector = vector.to1DArray();
      }
      if (vector.length !== matrix2.rows) {
        throw new RangeError("vector size must be the same as the number of rows");
      }
      return vector;
    }
    function checkRowIndices(matrix2, rowIndices) {
      if (!isAnyArray(rowIndices)) {
        throw new TypeError("row indices must be an array");
      }
      for (let i = 0; i < rowIndices.length; i++) {
        if (rowIndices[i] < 0 || rowIndices[i] >= matrix2.rows) {
          throw new RangeError("row indices are out of range");
        }
      }
    }
    function checkColumnIndices(matrix2, columnIndices) {
      if (!isAnyArray(columnIndices)) {
        throw new TypeError("column indices must be an array");
      }
      for (let i = 0; i < columnIndices.length; i++) {
        if (columnIndices[i] < 0 || columnIndices[i] >= matrix2.columns) {
          throw new RangeError("column indices are out of range");
        }
      }
    }
    function checkRange(matrix2, startRow, endRow, startColumn, endColumn) {
      if (arguments.length !== 5) {
        throw new RangeError("expected 4 arguments");
      }
      checkNumber("startRow", startRow);
      checkNumber("endRow", endRow);
      checkNumber("startColumn", startColumn);
      checkNumber("endColumn", endColumn);
      if (startRow > endRow || startColumn > endColumn || startRow < 0 || startRow >= matrix2.rows || endRow < 0 || endRow >= matrix2.rows || startColumn < 0 || startColumn >= matrix2.columns || endColumn < 0 || endColumn >= matrix2.columns) {
        throw new RangeError("Submatrix indices are out of range");
      }
    }
    function newArray(length, value = 0) {
      let array = [];
      for (let i = 0; i < length; i++) {
        array.push(value);
      }
      return array;
    }
    function checkNumber(name, value) {
      if (typeof value !== "number") {
        throw new TypeError(`${name} must be a number`);
      }
    }
    function checkNonEmpty(matrix2) {
      if (matrix2.isEmpty()) {
        throw new Error("Empty matrix has no elements to index");
      }
    }
    function sumByRow(matrix2) {
      let sum = newArray(matrix2.rows);
      for (let i = 0; i < matrix2.rows; ++i) {
        for (let j = 0; j < matrix2.columns; ++j) {
          sum[i] += matrix2.get(i, j);
        }
      }
      return sum;
    }
    function sumByColumn(matrix2) {
      let sum = newArray(matrix2.columns);
      for (let i = 0; i < matrix2.rows; ++i) {
        for (let j = 0; j < matrix2.columns; ++j) {
          sum[j] += matrix2.get(i, j);
        }
      }
      return sum;
    }
    function sumAll(matrix2) {
      let v = 0;
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          v += matrix2.get(i, j);
        }
      }
      return v;
    }
    function productByRow(matrix2) {
      let sum = newArray(matrix2.rows, 1);
      for (let i = 0; i < matrix2.rows; ++i) {
        for (let j = 0; j < matrix2.columns; ++j) {
          sum[i] *= matrix2.get(i, j);
        }
      }
      return sum;
    }
    function productByColumn(matrix2) {
      let sum = newArray(matrix2.columns, 1);
      for (let i = 0; i < matrix2.rows; ++i) {
        for (let j = 0; j < matrix2.columns; ++j) {
          sum[j] *= matrix2.get(i, j);
        }
      }
      return sum;
    }
    function productAll(matrix2) {
      let v = 1;
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          v *= matrix2.get(i, j);
        }
      }
      return v;
    }
    function varianceByRow(matrix2, unbiased, mean) {
      const rows = matrix2.rows;
      const cols = matrix2.columns;
      const variance = [];
      for (let i = 0; i < rows; i++) {
        let sum1 = 0;
        let sum2 = 0;
        let x = 0;
        for (let j = 0; j < cols; j++) {
          x = matrix2.get(i, j) - mean[i];
          sum1 += x;
          sum2 += x * x;
        }
        if (unbiased) {
          variance.push((sum2 - sum1 * sum1 / cols) / (cols - 1));
        } else {
          variance.push((sum2 - sum1 * sum1 / cols) / cols);
        }
      }
      return variance;
    }
    function varianceByColumn(matrix2, unbiased, mean) {
      const rows = matrix2.rows;
      const cols = matrix2.columns;
      const variance = [];
      for (let j = 0; j < cols; j++) {
        let sum1 = 0;
        let sum2 = 0;
        let x = 0;
        for (let i = 0; i < rows; i++) {
          x = matrix2.get(i, j) - mean[j];
          sum1 += x;
          sum2 += x * x;
        }
        if (unbiased) {
          variance.push((sum2 - sum1 * sum1 / rows) / (rows - 1));
        } else {
          variance.push((sum2 - sum1 * sum1 / rows) / rows);
        }
      }
      return variance;
    }
    function varianceAll(matrix2, unbiased, mean) {
      const rows = matrix2.rows;
      const cols = matrix2.columns;
      const size = rows * cols;
      let sum1 = 0;
      let sum2 = 0;
      let x = 0;
      for (let i = 0; i < rows; i++) {
        for (let j = 0; j < cols; j++) {
          x = matrix2.get(i, j) - mean;
          sum1 += x;
          sum2 += x * x;
        }
      }
      if (unbiased) {
        return (sum2 - sum1 * sum1 / size) / (size - 1);
      } else {
        return (sum2 - sum1 * sum1 / size) / size;
      }
    }
    function centerByRow(matrix2, mean) {
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          matrix2.set(i, j, matrix2.get(i, j) - mean[i]);
        }
      }
    }
    function centerByColumn(matrix2, mean) {
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          matrix2.set(i, j, matrix2.get(i, j) - mean[j]);
        }
      }
    }
    function centerAll(matrix2, mean) {
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          matrix2.set(i, j, matrix2.get(i, j) - mean);
        }
      }
    }
    function getScaleByRow(matrix2) {
      const scale = [];
      for (let i = 0; i < matrix2.rows; i++) {
        let sum = 0;
        for (let j = 0; j < matrix2.columns; j++) {
          sum += matrix2.get(i, j) ** 2 / (matrix2.columns - 1);
        }
        scale.push(Math.sqrt(sum));
      }
      return scale;
    }
    function scaleByRow(matrix2, scale) {
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          matrix2.set(i, j, matrix2.get(i, j) / scale[i]);
        }
      }
    }
    function getScaleByColumn(matrix2) {
      const scale = [];
      for (let j = 0; j < matrix2.columns; j++) {
        let sum = 0;
        for (let i = 0; i < matrix2.rows; i++) {
          sum += matrix2.get(i, j) ** 2 / (matrix2.rows - 1);
        }
        scale.push(Math.sqrt(sum));
      }
      return scale;
    }
    function scaleByColumn(matrix2, scale) {
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          matrix2.set(i, j, matrix2.get(i, j) / scale[j]);
        }
      }
    }
    function getScaleAll(matrix2) {
      const divider = matrix2.size - 1;
      let sum = 0;
      for (let j = 0; j < matrix2.columns; j++) {
        for (let i = 0; i < matrix2.rows; i++) {
          sum += matrix2.get(i, j) ** 2 / divider;
        }
      }
      return Math.sqrt(sum);
    }
    function scaleAll(matrix2, scale) {
      for (let i = 0; i < matrix2.rows; i++) {
        for (let j = 0; j < matrix2.columns; j++) {
          matrix2.set(i, j, matrix2.get(i, j) / scale);
        }
      }
    }
    var AbstractMatrix2 = class _AbstractMatrix {
      static from1DArray(newRows, newColumns, newData) {
        let length = newRows * newColumns;
        if (length !== newData.length) {
          throw new RangeError("data length does not match given dimensions");
        }
        let newMatrix = new Matrix3(newRows, newColumns);
        for (let row = 0; row < newRows; row++) {
          for (let column = 0; column < newColumns; column++) {
            newMatrix.set(row, column, newData[row * newColumns + column]);
          }
        }
        return newMatrix;
      }
      static rowVector(newData) {
        let vector = new Matrix3(1, newData.length);
        for (let i = 0; i < newData.length; i++) {
          vector.set(0, i, newData[i]);
        }
        return vector;
      }
      static columnVector(newData) {
        let vector = new Matrix3(newData.length, 1);
        for (let i = 0; i < newData.length; i++) {
          vector.set(i, 0, newData[i]);
        }
        return vector;
      }
      static zeros(rows, columns) {
        return new Matrix3(rows, columns);
      }
      static ones(rows, columns) {
        return new Matrix3(rows, columns).fill(1);
      }
      static rand(rows, columns, options = {}) {
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        const { random = Math.random } = options;
        let matrix2 = new Matrix3(rows, columns);
        for (let i = 0; i < rows; i++) {
          for (let j = 0; j < columns; j++) {
            matrix2.set(i, j, random());
          }
        }
        return matrix2;
      }
      static randInt(rows, columns, options = {}) {
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        const { min: min2 = 0, max: max2 = 1e3, random = Math.random } = options;
        if (!Number.isInteger(min2)) throw new TypeError("min must be an integer");
        if (!Number.isInteger(max2)) throw new TypeError("max must be an integer");
        if (min2 >= max2) throw new RangeError("min must be smaller than max");
        let interval = max2 - min2;
        let matrix2 = new Matrix3(rows, columns);
        for (let i = 0; i < rows; i++) {
          for (let j = 0; j < columns; j++) {
            let value = min2 + Math.round(random() * interval);
            matrix2.set(i, j, value);
          }
        }
        return matrix2;
      }
      static eye(rows, columns, value) {
        if (columns === void 0) columns = rows;
        if (value === void 0) value = 1;
        let min2 = Math.min(rows, columns);
        let matrix2 = this.zeros(rows, columns);
        for (let i = 0; i < min2; i++) {
          matrix2.set(i, i, value);
        }
        return matrix2;
      }
      static diag(data, rows, columns) {
        let l = data.length;
        if (rows === void 0) rows = l;
        if (columns === void 0) columns = rows;
        let min2 = Math.min(l, rows, columns);
        let matrix2 = this.zeros(rows, columns);
        for (let i = 0; i < min2; i++) {
          matrix2.set(i, i, data[i]);
        }
        return matrix2;
      }
      static min(matrix1, matrix2) {
        matrix1 = this.checkMatrix(matrix1);
        matrix2 = this.checkMatrix(matrix2);
        let rows = matrix1.rows;
        let columns = matrix1.columns;
        let result = new Matrix3(rows, columns);
        for (let i = 0; i < rows; i++) {
          for (let j = 0; j < columns; j++) {
            result.set(i, j, Math.min(matrix1.get(i, j), matrix2.get(i, j)));
          }
        }
        return result;
      }
      static max(matrix1, matrix2) {
        matrix1 = this.checkMatrix(matrix1);
        matrix2 = this.checkMatrix(matrix2);
        let rows = matrix1.rows;
        let columns = matrix1.columns;
        let result = new this(rows, columns);
        for (let i = 0; i < rows; i++) {
          for (let j = 0; j < columns; j++) {
            result.set(i, j, Math.max(matrix1.get(i, j), matrix2.get(i, j)));
          }
        }
        return result;
      }
      static checkMatrix(value) {
        return _AbstractMatrix.isMatrix(value) ? value : new Matrix3(value);
      }
      static isMatrix(value) {
        return value != null && value.klass === "Matrix";
      }
      get size() {
        return this.rows * this.columns;
      }
      apply(callback) {
        if (typeof callback !== "function") {
          throw new TypeError("callback must be a function");
        }
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            callback.call(this, i, j);
          }
        }
        return this;
      }
      applyAlongAxis(callback, by) {
        if (typeof callback !== "function") {
          throw new TypeError("callback must be a function");
        }
        const result = [];
        switch (by) {
          case "row": {
            for (let i = 0; i < this.rows; i++) {
              result.push(callback.call(this, this.getRow(i), i));
            }
            break;
          }
          case "column": {
            for (let i = 0; i < this.columns; i++) {
              result.push(callback.call(this, this.getColumn(i), i));
            }
            break;
          }
          default:
            throw new Error(`invalid option: ${by}`);
        }
        return result;
      }
      to1DArray() {
        let array = [];
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            array.push(this.get(i, j));
          }
        }
        return array;
      }
      to2DArray() {
        let copy = [];
        for (let i = 0; i < this.rows; i++) {
          copy.push([]);
          for (let j = 0; j < this.columns; j++) {
            copy[i].push(this.get(i, j));
          }
        }
        return copy;
      }
      toJSON() {
        return this.to2DArray();
      }
      isRowVector() {
        return this.rows === 1;
      }
      isColumnVector() {
        return this.columns === 1;
      }
      isVector() {
        return this.rows === 1 || this.columns === 1;
      }
      isSquare() {
        return this.rows === this.columns;
      }
      isEmpty() {
        return this.rows === 0 || this.columns === 0;
      }
      isSymmetric() {
        if (this.isSquare()) {
          for (let i = 0; i < this.rows; i++) {
            for (let j = 0; j <= i; j++) {
              if (this.get(i, j) !== this.get(j, i)) {
                return false;
              }
            }
          }
          return true;
        }
        return false;
      }
      isDistance() {
        if (!this.isSymmetric()) return false;
        for (let i = 0; i < this.rows; i++) {
          if (this.get(i, i) !== 0) return false;
        }
        return true;
      }
      isEchelonForm() {
        let i = 0;
        let j = 0;
        let previousColumn = -1;
        let isEchelonForm = true;
        let checked = false;
        while (i < this.rows && isEchelonForm) {
          j = 0;
          checked = false;
          while (j < this.columns && checked === false) {
            if (this.get(i, j) === 0) {
              j++;
            } else if (this.get(i, j) === 1 && j > previousColumn) {
              checked = true;
              previousColumn = j;
            } else {
              isEchelonForm = false;
              checked = true;
            }
          }
          i++;
        }
        return isEchelonForm;
      }
      isReducedEchelonForm() {
        let i = 0;
        let j = 0;
        let previousColumn = -1;
        let isReducedEchelonForm = true;
        let checked = false;
        while (i < this.rows && isReducedEchelonForm) {
          j = 0;
          checked = false;
          while (j < this.columns && checked === false) {
            if (this.get(i, j) === 0) {
              j++;
            } else if (this.get(i, j) === 1 && j > previousColumn) {
              checked = true;
              previousColumn = j;
            } else {
              isReducedEchelonForm = false;
              checked = true;
            }
          }
          for (let k = j + 1; k < this.rows; k++) {
            if (this.get(i, k) !== 0) {
              isReducedEchelonForm = false;
            }
          }
          i++;
        }
        return isReducedEchelonForm;
      }
      echelonForm() {
        let result = this.clone();
        let h = 0;
        let k = 0;
        while (h < result.rows && k < result.columns) {
          let iMax = h;
          for (let i = h; i < result.rows; i++) {
            if (result.get(i, k) > result.get(iMax, k)) {
              iMax = i;
            }
          }
          if (result.get(iMax, k) === 0) {
            k++;
          } else {
            result.swapRows(h, iMax);
            let tmp = result.get(h, k);
            for (let j = k; j < result.columns; j++) {
              result.set(h, j, result.get(h, j) / tmp);
            }
            for (let i = h + 1; i < result.rows; i++) {
              let factor = result.get(i, k) / result.get(h, k);
              result.set(i, k, 0);
              for (let j = k + 1; j < result.columns; j++) {
                result.set(i, j, result.get(i, j) - result.get(h, j) * factor);
              }
            }
            h++;
            k++;
          }
        }
        return result;
      }
      reducedEchelonForm() {
        let result = this.echelonForm();
        let m = result.columns;
        let n2 = result.rows;
        let h = n2 - 1;
        while (h >= 0) {
          if (result.maxRow(h) === 0) {
            h--;
          } else {
            let p = 0;
            let pivot = false;
            while (p < n2 && pivot === false) {
              if (result.get(h, p) === 1) {
                pivot = true;
              } else {
                p++;
              }
            }
            for (let i = 0; i < h; i++) {
              let factor = result.get(i, p);
              for (let j = p; j < m; j++) {
                let tmp = result.get(i, j) - factor * result.get(h, j);
                result.set(i, j, tmp);
              }
            }
            h--;
          }
        }
        return result;
      }
      set() {
        throw new Error("set method is unimplemented");
      }
      get() {
        throw new Error("get method is unimplemented");
      }
      repeat(options = {}) {
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        const { rows = 1, columns = 1 } = options;
        if (!Number.isInteger(rows) || rows <= 0) {
          throw new TypeError("rows must be a positive integer");
        }
        if (!Number.isInteger(columns) || columns <= 0) {
          throw new TypeError("columns must be a positive integer");
        }
        let matrix2 = new Matrix3(this.rows * rows, this.columns * columns);
        for (let i = 0; i < rows; i++) {
          for (let j = 0; j < columns; j++) {
            matrix2.setSubMatrix(this, this.rows * i, this.columns * j);
          }
        }
        return matrix2;
      }
      fill(value) {
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, value);
          }
        }
        return this;
      }
      neg() {
        return this.mulS(-1);
      }
      getRow(index2) {
        checkRowIndex(this, index2);
        let row = [];
        for (let i = 0; i < this.columns; i++) {
          row.push(this.get(index2, i));
        }
        return row;
      }
      getRowVector(index2) {
        return Matrix3.rowVector(this.getRow(index2));
      }
      setRow(index2, array) {
        checkRowIndex(this, index2);
        array = checkRowVector(this, array);
        for (let i = 0; i < this.columns; i++) {
          this.set(index2, i, array[i]);
        }
        return this;
      }
      swapRows(row1, row2) {
        checkRowIndex(this, row1);
        checkRowIndex(this, row2);
        for (let i = 0; i < this.columns; i++) {
          let temp = this.get(row1, i);
          this.set(row1, i, this.get(row2, i));
          this.set(row2, i, temp);
        }
        return this;
      }
      getColumn(index2) {
        checkColumnIndex(this, index2);
        let column = [];
        for (let i = 0; i < this.rows; i++) {
          column.push(this.get(i, index2));
        }
        return column;
      }
      getColumnVector(index2) {
        return Matrix3.columnVector(this.getColumn(index2));
      }
      setColumn(index2, array) {
        checkColumnIndex(this, index2);
        array = checkColumnVector(this, array);
        for (let i = 0; i < this.rows; i++) {
          this.set(i, index2, array[i]);
        }
        return this;
      }
      swapColumns(column1, column2) {
        checkColumnIndex(this, column1);
        checkColumnIndex(this, column2);
        for (let i = 0; i < this.rows; i++) {
          let temp = this.get(i, column1);
          this.set(i, column1, this.get(i, column2));
          this.set(i, column2, temp);
        }
        return this;
      }
      addRowVector(vector) {
        vector = checkRowVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) + vector[j]);
          }
        }
        return this;
      }
      subRowVector(vector) {
        vector = checkRowVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) - vector[j]);
          }
        }
        return this;
      }
      mulRowVector(vector) {
        vector = checkRowVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) * vector[j]);
          }
        }
        return this;
      }
      divRowVector(vector) {
        vector = checkRowVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) / vector[j]);
          }
        }
        return this;
      }
      addColumnVector(vector) {
        vector = checkColumnVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) + vector[i]);
          }
        }
        return this;
      }
      subColumnVector(vector) {
        vector = checkColumnVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) - vector[i]);
          }
        }
        return this;
      }
      mulColumnVector(vector) {
        vector = checkColumnVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) * vector[i]);
          }
        }
        return this;
      }
      divColumnVector(vector) {
        vector = checkColumnVector(this, vector);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            this.set(i, j, this.get(i, j) / vector[i]);
          }
        }
        return this;
      }
      mulRow(index2, value) {
        checkRowIndex(this, index2);
        for (let i = 0; i < this.columns; i++) {
          this.set(index2, i, this.get(index2, i) * value);
        }
        return this;
      }
      mulColumn(index2, value) {
        checkColumnIndex(this, index2);
        for (let i = 0; i < this.rows; i++) {
          this.set(i, index2, this.get(i, index2) * value);
        }
        return this;
      }
      max(by) {
        if (this.isEmpty()) {
          return NaN;
        }
        switch (by) {
          case "row": {
            const max2 = new Array(this.rows).fill(Number.NEGATIVE_INFINITY);
            for (let row = 0; row < this.rows; row++) {
              for (let column = 0; column < this.columns; column++) {
                if (this.get(row, column) > max2[row]) {
                  max2[row] = this.get(row, column);
                }
              }
            }
            return max2;
          }
          case "column": {
            const max2 = new Array(this.columns).fill(Number.NEGATIVE_INFINITY);
            for (let row = 0; row < this.rows; row++) {
              for (let column = 0; column < this.columns; column++) {
                if (this.get(row, column) > max2[column]) {
                  max2[column] = this.get(row, column);
                }
              }
            }
            return max2;
          }
          case void 0: {
            let max2 = this.get(0, 0);
            for (let row = 0; row < this.rows; row++) {
              for (let column = 0; column < this.columns; column++) {
                if (this.get(row, column) > max2) {
                  max2 = this.get(row, column);
                }
              }
            }
            return max2;
          }
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      maxIndex() {
        checkNonEmpty(this);
        let v = this.get(0, 0);
        let idx = [0, 0];
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            if (this.get(i, j) > v) {
              v = this.get(i, j);
              idx[0] = i;
              idx[1] = j;
            }
          }
        }
        return idx;
      }
      min(by) {
        if (this.isEmpty()) {
          return NaN;
        }
        switch (by) {
          case "row": {
            const min2 = new Array(this.rows).fill(Number.POSITIVE_INFINITY);
            for (let row = 0; row < this.rows; row++) {
              for (let column = 0; column < this.columns; column++) {
                if (this.get(row, column) < min2[row]) {
                  min2[row] = this.get(row, column);
                }
              }
            }
            return min2;
          }
          case "column": {
            const min2 = new Array(this.columns).fill(Number.POSITIVE_INFINITY);
            for (let row = 0; row < this.rows; row++) {
              for (let column = 0; column < this.columns; column++) {
                if (this.get(row, column) < min2[column]) {
                  min2[column] = this.get(row, column);
                }
              }
            }
            return min2;
          }
          case void 0: {
            let min2 = this.get(0, 0);
            for (let row = 0; row < this.rows; row++) {
              for (let column = 0; column < this.columns; column++) {
                if (this.get(row, column) < min2) {
                  min2 = this.get(row, column);
                }
              }
            }
            return min2;
          }
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      minIndex() {
        checkNonEmpty(this);
        let v = this.get(0, 0);
        let idx = [0, 0];
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            if (this.get(i, j) < v) {
              v = this.get(i, j);
              idx[0] = i;
              idx[1] = j;
            }
          }
        }
        return idx;
      }
      maxRow(row) {
        checkRowIndex(this, row);
        if (this.isEmpty()) {
          return NaN;
        }
        let v = this.get(row, 0);
        for (let i = 1; i < this.columns; i++) {
          if (this.get(row, i) > v) {
            v = this.get(row, i);
          }
        }
        return v;
      }
      maxRowIndex(row) {
        checkRowIndex(this, row);
        checkNonEmpty(this);
        let v = this.get(row, 0);
        let idx = [row, 0];
        for (let i = 1; i < this.columns; i++) {
          if (this.get(row, i) > v) {
            v = this.get(row, i);
            idx[1] = i;
          }
        }
        return idx;
      }
      minRow(row) {
        checkRowIndex(this, row);
        if (this.isEmpty()) {
          return NaN;
        }
        let v = this.get(row, 0);
        for (let i = 1; i < this.columns; i++) {
          if (this.get(row, i) < v) {
            v = this.get(row, i);
          }
        }
        return v;
      }
      minRowIndex(row) {
        checkRowIndex(this, row);
        checkNonEmpty(this);
        let v = this.get(row, 0);
        let idx = [row, 0];
        for (let i = 1; i < this.columns; i++) {
          if (this.get(row, i) < v) {
            v = this.get(row, i);
            idx[1] = i;
          }
        }
        return idx;
      }
      maxColumn(column) {
        checkColumnIndex(this, column);
        if (this.isEmpty()) {
          return NaN;
        }
        let v = this.get(0, column);
        for (let i = 1; i < this.rows; i++) {
          if (this.get(i, column) > v) {
            v = this.get(i, column);
          }
        }
        return v;
      }
      maxColumnIndex(column) {
        checkColumnIndex(this, column);
        checkNonEmpty(this);
        let v = this.get(0, column);
        let idx = [0, column];
        for (let i = 1; i < this.rows; i++) {
          if (this.get(i, column) > v) {
            v = this.get(i, column);
            idx[0] = i;
          }
        }
        return idx;
      }
      minColumn(column) {
        checkColumnIndex(this, column);
        if (this.isEmpty()) {
          return NaN;
        }
        let v = this.get(0, column);
        for (let i = 1; i < this.rows; i++) {
          if (this.get(i, column) < v) {
            v = this.get(i, column);
          }
        }
        return v;
      }
      minColumnIndex(column) {
        checkColumnIndex(this, column);
        checkNonEmpty(this);
        let v = this.get(0, column);
        let idx = [0, column];
        for (let i = 1; i < this.rows; i++) {
          if (this.get(i, column) < v) {
            v = this.get(i, column);
            idx[0] = i;
          }
        }
        return idx;
      }
      diag() {
        let min2 = Math.min(this.rows, this.columns);
        let diag = [];
        for (let i = 0; i < min2; i++) {
          diag.push(this.get(i, i));
        }
        return diag;
      }
      norm(type = "frobenius") {
        switch (type) {
          case "max":
            return Matrix3.abs(this).max();
          case "frobenius":
            return Math.sqrt(this.dot(this));
          default:
            throw new RangeError(`unknown norm type: ${type}`);
        }
      }
      cumulativeSum() {
        let sum = 0;
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            sum += this.get(i, j);
            this.set(i, j, sum);
          }
        }
        return this;
      }
      dot(vector2) {
        if (_AbstractMatrix.isMatrix(vector2)) vector2 = vector2.to1DArray();
        let vector1 = this.to1DArray();
        if (vector1.length !== vector2.length) {
          throw new RangeError("vectors do not have the same size");
        }
        let dot2 = 0;
        for (let i = 0; i < vector1.length; i++) {
          dot2 += vector1[i] * vector2[i];
        }
        return dot2;
      }
      mmul(other) {
        other = Matrix3.checkMatrix(other);
        let m = this.rows;
        let n2 = this.columns;
        let p = other.columns;
        let result = new Matrix3(m, p);
        let Bcolj = new Float64Array(n2);
        for (let j = 0; j < p; j++) {
          for (let k = 0; k < n2; k++) {
            Bcolj[k] = other.get(k, j);
          }
          for (let i = 0; i < m; i++) {
            let s = 0;
            for (let k = 0; k < n2; k++) {
              s += this.get(i, k) * Bcolj[k];
            }
            result.set(i, j, s);
          }
        }
        return result;
      }
      gram() {
        const rows = this.rows;
        const n2 = this.columns;
        const gramData = new Float64Array(n2 * n2);
        for (let r = 0; r < rows; r++) {
          for (let i = 0; i < n2; i++) {
            const value = this.get(r, i);
            if (value === 0) continue;
            const offset = i * n2;
            for (let j = i; j < n2; j++) {
              gramData[offset + j] += value * this.get(r, j);
            }
          }
        }
        const result = new Matrix3(n2, n2);
        for (let i = 0; i < n2; i++) {
          const offset = i * n2;
          for (let j = i; j < n2; j++) {
            const value = gramData[offset + j];
            result.set(i, j, value);
            result.set(j, i, value);
          }
        }
        return result;
      }
      transposeMultiply(other) {
        other = Matrix3.checkMatrix(other);
        if (this.rows !== other.rows) {
          throw new RangeError(
            "the number of rows of the two matrices must be equal"
          );
        }
        const n2 = this.columns;
        const p = other.columns;
        const result = new Matrix3(n2, p);
        const otherRow = new Float64Array(p);
        for (let r = 0; r < this.rows; r++) {
          for (let j = 0; j < p; j++) {
            otherRow[j] = other.get(r, j);
          }
          for (let i = 0; i < n2; i++) {
            const value = this.get(r, i);
            if (value === 0) continue;
            const resultRow = result.data[i];
            for (let j = 0; j < p; j++) {
              resultRow[j] += value * otherRow[j];
            }
          }
        }
        return result;
      }
      mmulByTranspose(scale) {
        let m = this.rows;
        let n2 = this.columns;
        if (scale !== void 0 && scale.length !== n2) {
          throw new RangeError("scale must have one value per column");
        }
        let result = new Matrix3(m, m);
        let rowj = new Float64Array(n2);
        for (let j = 0; j < m; j++) {
          if (scale === void 0) {
            for (let k = 0; k < n2; k++) {
              rowj[k] = this.get(j, k);
            }
          } else {
            for (let k = 0; k < n2; k++) {
              rowj[k] = scale[k] * this.get(j, k);
            }
          }
          for (let i = j; i < m; i++) {
            let s = 0;
            for (let k = 0; k < n2; k++) {
              s += this.get(i, k) * rowj[k];
            }
            result.set(i, j, s);
            result.set(j, i, s);
          }
        }
        return result;
      }
      mpow(scalar) {
        if (!this.isSquare()) {
          throw new RangeError("Matrix must be square");
        }
        if (!Number.isInteger(scalar) || scalar < 0) {
          throw new RangeError("Exponent must be a non-negative integer");
        }
        let result = Matrix3.eye(this.rows);
        let bb = this;
        for (let e = scalar; e >= 1; e /= 2) {
          if ((e & 1) !== 0) {
            result = result.mmul(bb);
          }
          bb = bb.mmul(bb);
        }
        return result;
      }
      strassen2x2(other) {
        other = Matrix3.checkMatrix(other);
        let result = new Matrix3(2, 2);
        const a11 = this.get(0, 0);
        const b11 = other.get(0, 0);
        const a12 = this.get(0, 1);
        const b12 = other.get(0, 1);
        const a21 = this.get(1, 0);
        const b21 = other.get(1, 0);
        const a22 = this.get(1, 1);
        const b22 = other.get(1, 1);
        const m1 = (a11 + a22) * (b11 + b22);
        const m2 = (a21 + a22) * b11;
        const m3 = a11 * (b12 - b22);
        const m4 = a22 * (b21 - b11);
        const m5 = (a11 + a12) * b22;
        const m6 = (a21 - a11) * (b11 + b12);
        const m7 = (a12 - a22) * (b21 + b22);
        const c00 = m1 + m4 - m5 + m7;
        const c01 = m3 + m5;
        const c10 = m2 + m4;
        const c11 = m1 - m2 + m3 + m6;
        result.set(0, 0, c00);
        result.set(0, 1, c01);
        result.set(1, 0, c10);
        result.set(1, 1, c11);
        return result;
      }
      strassen3x3(other) {
        other = Matrix3.checkMatrix(other);
        let result = new Matrix3(3, 3);
        const a00 = this.get(0, 0);
        const a01 = this.get(0, 1);
        const a02 = this.get(0, 2);
        const a10 = this.get(1, 0);
        const a11 = this.get(1, 1);
        const a12 = this.get(1, 2);
        const a20 = this.get(2, 0);
        const a21 = this.get(2, 1);
        const a22 = this.get(2, 2);
        const b00 = other.get(0, 0);
        const b01 = other.get(0, 1);
        const b02 = other.get(0, 2);
        const b10 = other.get(1, 0);
        const b11 = other.get(1, 1);
        const b12 = other.get(1, 2);
        const b20 = other.get(2, 0);
        const b21 = other.get(2, 1);
        const b22 = other.get(2, 2);
        const m1 = (a00 + a01 + a02 - a10 - a11 - a21 - a22) * b11;
        const m2 = (a00 - a10) * (-b01 + b11);
        const m3 = a11 * (-b00 + b01 + b10 - b11 - b12 - b20 + b22);
        const m4 = (-a00 + a10 + a11) * (b00 - b01 + b11);
        const m5 = (a10 + a11) * (-b00 + b01);
        const m6 = a00 * b00;
        const m7 = (-a00 + a20 + a21) * (b00 - b02 + b12);
        const m8 = (-a00 + a20) * (b02 - b12);
        const m9 = (a20 + a21) * (-b00 + b02);
        const m10 = (a00 + a01 + a02 - a11 - a12 - a20 - a21) * b12;
        const m11 = a21 * (-b00 + b02 + b10 - b11 - b12 - b20 + b21);
        const m12 = (-a02 + a21 + a22) * (b11 + b20 - b21);
        const m13 = (a02 - a22) * (b11 - b21);
        const m14 = a02 * b20;
        const m15 = (a21 + a22) * (-b20 + b21);
        const m16 = (-a02 + a11 + a12) * (b12 + b20 - b22);
        const m17 = (a02 - a12) * (b12 - b22);
        const m18 = (a11 + a12) * (-b20 + b22);
        const m19 = a01 * b10;
        const m20 = a12 * b21;
        const m21 = a10 * b02;
        const m22 = a20 * b01;
        const m23 = a22 * b22;
        const c00 = m6 + m14 + m19;
        const c01 = m1 + m4 + m5 + m6 + m12 + m14 + m15;
        const c02 = m6 + m7 + m9 + m10 + m14 + m16 + m18;
        const c10 = m2 + m3 + m4 + m6 + m14 + m16 + m17;
        const c11 = m2 + m4 + m5 + m6 + m20;
        const c12 = m14 + m16 + m17 + m18 + m21;
        const c20 = m6 + m7 + m8 + m11 + m12 + m13 + m14;
        const c21 = m12 + m13 + m14 + m15 + m22;
        const c22 = m6 + m7 + m8 + m9 + m23;
        result.set(0, 0, c00);
        result.set(0, 1, c01);
        result.set(0, 2, c02);
        result.set(1, 0, c10);
        result.set(1, 1, c11);
        result.set(1, 2, c12);
        result.set(2, 0, c20);
        result.set(2, 1, c21);
        result.set(2, 2, c22);
        return result;
      }
      mmulStrassen(y) {
        y = Matrix3.checkMatrix(y);
        let x = this.clone();
        let r1 = x.rows;
        let c1 = x.columns;
        let r2 = y.rows;
        let c2 = y.columns;
        if (c1 !== r2) {
          console.warn(
            `Multiplying ${r1} x ${c1} and ${r2} x ${c2} matrix: dimensions do not match.`
          );
        }
        function embed(mat, rows, cols) {
          let r3 = mat.rows;
          let c3 = mat.columns;
          if (r3 === rows && c3 === cols) {
            return mat;
          } else {
            let resultat = _AbstractMatrix.zeros(rows, cols);
            resultat = resultat.setSubMatrix(mat, 0, 0);
            return resultat;
          }
        }
        let r = Math.max(r1, r2);
        let c = Math.max(c1, c2);
        x = embed(x, r, c);
        y = embed(y, r, c);
        function blockMult(a, b, rows, cols) {
          if (rows <= 512 || cols <= 512) {
            return a.mmul(b);
          }
          if (rows % 2 === 1 && cols % 2 === 1) {
            a = embed(a, rows + 1, cols + 1);
            b = embed(b, rows + 1, cols + 1);
          } else if (rows % 2 === 1) {
            a = embed(a, rows + 1, cols);
            b = embed(b, rows + 1, cols);
          } else if (cols % 2 === 1) {
            a = embed(a, rows, cols + 1);
            b = embed(b, rows, cols + 1);
          }
          let halfRows = parseInt(a.rows / 2, 10);
          let halfCols = parseInt(a.columns / 2, 10);
          let a11 = a.subMatrix(0, halfRows - 1, 0, halfCols - 1);
          let b11 = b.subMatrix(0, halfRows - 1, 0, halfCols - 1);
          let a12 = a.subMatrix(0, halfRows - 1, halfCols, a.columns - 1);
          let b12 = b.subMatrix(0, halfRows - 1, halfCols, b.columns - 1);
          let a21 = a.subMatrix(halfRows, a.rows - 1, 0, halfCols - 1);
          let b21 = b.subMatrix(halfRows, b.rows - 1, 0, halfCols - 1);
          let a22 = a.subMatrix(halfRows, a.rows - 1, halfCols, a.columns - 1);
          let b22 = b.subMatrix(halfRows, b.rows - 1, halfCols, b.columns - 1);
          let m1 = blockMult(
            _AbstractMatrix.add(a11, a22),
            _AbstractMatrix.add(b11, b22),
            halfRows,
            halfCols
          );
          let m2 = blockMult(_AbstractMatrix.add(a21, a22), b11, halfRows, halfCols);
          let m3 = blockMult(a11, _AbstractMatrix.sub(b12, b22), halfRows, halfCols);
          let m4 = blockMult(a22, _AbstractMatrix.sub(b21, b11), halfRows, halfCols);
          let m5 = blockMult(_AbstractMatrix.add(a11, a12), b22, halfRows, halfCols);
          let m6 = blockMult(
            _AbstractMatrix.sub(a21, a11),
            _AbstractMatrix.add(b11, b12),
            halfRows,
            halfCols
          );
          let m7 = blockMult(
            _AbstractMatrix.sub(a12, a22),
            _AbstractMatrix.add(b21, b22),
            halfRows,
            halfCols
          );
          let c11 = _AbstractMatrix.add(m1, m4);
          c11.sub(m5);
          c11.add(m7);
          let c12 = _AbstractMatrix.add(m3, m5);
          let c21 = _AbstractMatrix.add(m2, m4);
          let c22 = _AbstractMatrix.sub(m1, m2);
          c22.add(m3);
          c22.add(m6);
          let result = _AbstractMatrix.zeros(2 * c11.rows, 2 * c11.columns);
          result = result.setSubMatrix(c11, 0, 0);
          result = result.setSubMatrix(c12, c11.rows, 0);
          result = result.setSubMatrix(c21, 0, c11.columns);
          result = result.setSubMatrix(c22, c11.rows, c11.columns);
          return result.subMatrix(0, rows - 1, 0, cols - 1);
        }
        return blockMult(x, y, r, c);
      }
      scaleRows(options = {}) {
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        const { min: min2 = 0, max: max2 = 1 } = options;
        if (!Number.isFinite(min2)) throw new TypeError("min must be a number");
        if (!Number.isFinite(max2)) throw new TypeError("max must be a number");
        if (min2 >= max2) throw new RangeError("min must be smaller than max");
        let newMatrix = new Matrix3(this.rows, this.columns);
        for (let i = 0; i < this.rows; i++) {
          const row = this.getRow(i);
          if (row.length > 0) {
            rescale(row, { min: min2, max: max2, output: row });
          }
          newMatrix.setRow(i, row);
        }
        return newMatrix;
      }
      scaleColumns(options = {}) {
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        const { min: min2 = 0, max: max2 = 1 } = options;
        if (!Number.isFinite(min2)) throw new TypeError("min must be a number");
        if (!Number.isFinite(max2)) throw new TypeError("max must be a number");
        if (min2 >= max2) throw new RangeError("min must be smaller than max");
        let newMatrix = new Matrix3(this.rows, this.columns);
        for (let i = 0; i < this.columns; i++) {
          const column = this.getColumn(i);
          if (column.length) {
            rescale(column, {
              min: min2,
              max: max2,
              output: column
            });
          }
          newMatrix.setColumn(i, column);
        }
        return newMatrix;
      }
      flipRows() {
        const middle = Math.ceil(this.columns / 2);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < middle; j++) {
            let first = this.get(i, j);
            let last = this.get(i, this.columns - 1 - j);
            this.set(i, j, last);
            this.set(i, this.columns - 1 - j, first);
          }
        }
        return this;
      }
      flipColumns() {
        const middle = Math.ceil(this.rows / 2);
        for (let j = 0; j < this.columns; j++) {
          for (let i = 0; i < middle; i++) {
            let first = this.get(i, j);
            let last = this.get(this.rows - 1 - i, j);
            this.set(i, j, last);
            this.set(this.rows - 1 - i, j, first);
          }
        }
        return this;
      }
      kroneckerProduct(other) {
        other = Matrix3.checkMatrix(other);
        let m = this.rows;
        let n2 = this.columns;
        let p = other.rows;
        let q = other.columns;
        let result = new Matrix3(m * p, n2 * q);
        for (let i = 0; i < m; i++) {
          for (let j = 0; j < n2; j++) {
            for (let k = 0; k < p; k++) {
              for (let l = 0; l < q; l++) {
                result.set(p * i + k, q * j + l, this.get(i, j) * other.get(k, l));
              }
            }
          }
        }
        return result;
      }
      kroneckerSum(other) {
        other = Matrix3.checkMatrix(other);
        if (!this.isSquare() || !other.isSquare()) {
          throw new Error("Kronecker Sum needs two Square Matrices");
        }
        let m = this.rows;
        let n2 = other.rows;
        let AxI = this.kroneckerProduct(Matrix3.eye(n2, n2));
        let IxB = Matrix3.eye(m, m).kroneckerProduct(other);
        return AxI.add(IxB);
      }
      transpose() {
        let result = new Matrix3(this.columns, this.rows);
        for (let i = 0; i < this.rows; i++) {
          for (let j = 0; j < this.columns; j++) {
            result.set(j, i, this.get(i, j));
          }
        }
        return result;
      }
      sortRows(compareFunction = compareNumbers) {
        for (let i = 0; i < this.rows; i++) {
          this.setRow(i, this.getRow(i).sort(compareFunction));
        }
        return this;
      }
      sortColumns(compareFunction = compareNumbers) {
        for (let i = 0; i < this.columns; i++) {
          this.setColumn(i, this.getColumn(i).sort(compareFunction));
        }
        return this;
      }
      subMatrix(startRow, endRow, startColumn, endColumn) {
        checkRange(this, startRow, endRow, startColumn, endColumn);
        let newMatrix = new Matrix3(
          endRow - startRow + 1,
          endColumn - startColumn + 1
        );
        for (let i = startRow; i <= endRow; i++) {
          for (let j = startColumn; j <= endColumn; j++) {
            newMatrix.set(i - startRow, j - startColumn, this.get(i, j));
          }
        }
        return newMatrix;
      }
      subMatrixRow(indices, startColumn, endColumn) {
        if (startColumn === void 0) startColumn = 0;
        if (endColumn === void 0) endColumn = this.columns - 1;
        if (startColumn > endColumn || startColumn < 0 || startColumn >= this.columns || endColumn < 0 || endColumn >= this.columns) {
          throw new RangeError("Argument out of range");
        }
        let newMatrix = new Matrix3(indices.length, endColumn - startColumn + 1);
        for (let i = 0; i < indices.length; i++) {
          for (let j = startColumn; j <= endColumn; j++) {
            if (indices[i] < 0 || indices[i] >= this.rows) {
              throw new RangeError(`Row index out of range: ${indices[i]}`);
            }
            newMatrix.set(i, j - startColumn, this.get(indices[i], j));
          }
        }
        return newMatrix;
      }
      subMatrixColumn(indices, startRow, endRow) {
        if (startRow === void 0) startRow = 0;
        if (endRow === void 0) endRow = this.rows - 1;
        if (startRow > endRow || startRow < 0 || startRow >= this.rows || endRow < 0 || endRow >= this.rows) {
          throw new RangeError("Argument out of range");
        }
        let newMatrix = new Matrix3(endRow - startRow + 1, indices.length);
        for (let i = 0; i < indices.length; i++) {
          for (let j = startRow; j <= endRow; j++) {
            if (indices[i] < 0 || indices[i] >= this.columns) {
              throw new RangeError(`Column index out of range: ${indices[i]}`);
            }
            newMatrix.set(j - startRow, i, this.get(j, indices[i]));
          }
        }
        return newMatrix;
      }
      setSubMatrix(matrix2, startRow, startColumn) {
        matrix2 = Matrix3.checkMatrix(matrix2);
        if (matrix2.isEmpty()) {
          return this;
        }
        let endRow = startRow + matrix2.rows - 1;
        let endColumn = startColumn + matrix2.columns - 1;
        checkRange(this, startRow, endRow, startColumn, endColumn);
        for (let i = 0; i < matrix2.rows; i++) {
          for (let j = 0; j < matrix2.columns; j++) {
            this.set(startRow + i, startColumn + j, matrix2.get(i, j));
          }
        }
        return this;
      }
      concat(other, by = "row") {
        other = Matrix3.checkMatrix(other);
        switch (by) {
          case "row": {
            if (this.columns !== other.columns) {
              throw new RangeError(
                "both matrices must have the same number of columns"
              );
            }
            const result = new Matrix3(this.rows + other.rows, this.columns);
            result.setSubMatrix(this, 0, 0);
            result.setSubMatrix(other, this.rows, 0);
            return result;
          }
          case "column": {
            if (this.rows !== other.rows) {
              throw new RangeError(
                "both matrices must have the same number of rows"
              );
            }
            const result = new Matrix3(this.rows, this.columns + other.columns);
            result.setSubMatrix(this, 0, 0);
            result.setSubMatrix(other, 0, this.columns);
            return result;
          }
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      selection(rowIndices, columnIndices) {
        checkRowIndices(this, rowIndices);
        checkColumnIndices(this, columnIndices);
        let newMatrix = new Matrix3(rowIndices.length, columnIndices.length);
        for (let i = 0; i < rowIndices.length; i++) {
          let rowIndex = rowIndices[i];
          for (let j = 0; j < columnIndices.length; j++) {
            let columnIndex = columnIndices[j];
            newMatrix.set(i, j, this.get(rowIndex, columnIndex));
          }
        }
        return newMatrix;
      }
      trace() {
        let min2 = Math.min(this.rows, this.columns);
        let trace = 0;
        for (let i = 0; i < min2; i++) {
          trace += this.get(i, i);
        }
        return trace;
      }
      clone() {
        return this.constructor.copy(this, new Matrix3(this.rows, this.columns));
      }
      /**
       * @template {AbstractMatrix} M
       * @param {AbstractMatrix} from
       * @param {M} to
       * @return {M}
       */
      static copy(from, to) {
        for (const [row, column, value] of from.entries()) {
          to.set(row, column, value);
        }
        return to;
      }
      sum(by) {
        switch (by) {
          case "row":
            return sumByRow(this);
          case "column":
            return sumByColumn(this);
          case void 0:
            return sumAll(this);
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      product(by) {
        switch (by) {
          case "row":
            return productByRow(this);
          case "column":
            return productByColumn(this);
          case void 0:
            return productAll(this);
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      mean(by) {
        const sum = this.sum(by);
        switch (by) {
          case "row": {
            for (let i = 0; i < this.rows; i++) {
              sum[i] /= this.columns;
            }
            return sum;
          }
          case "column": {
            for (let i = 0; i < this.columns; i++) {
              sum[i] /= this.rows;
            }
            return sum;
          }
          case void 0:
            return sum / this.size;
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      variance(by, options = {}) {
        if (typeof by === "object") {
          options = by;
          by = void 0;
        }
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        const { unbiased = true, mean = this.mean(by) } = options;
        if (typeof unbiased !== "boolean") {
          throw new TypeError("unbiased must be a boolean");
        }
        switch (by) {
          case "row": {
            if (!isAnyArray(mean)) {
              throw new TypeError("mean must be an array");
            }
            return varianceByRow(this, unbiased, mean);
          }
          case "column": {
            if (!isAnyArray(mean)) {
              throw new TypeError("mean must be an array");
            }
            return varianceByColumn(this, unbiased, mean);
          }
          case void 0: {
            if (typeof mean !== "number") {
              throw new TypeError("mean must be a number");
            }
            return varianceAll(this, unbiased, mean);
          }
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      standardDeviation(by, options) {
        if (typeof by === "object") {
          options = by;
          by = void 0;
        }
        const variance = this.variance(by, options);
        if (by === void 0) {
          return Math.sqrt(variance);
        } else {
          for (let i = 0; i < variance.length; i++) {
            variance[i] = Math.sqrt(variance[i]);
          }
          return variance;
        }
      }
      center(by, options = {}) {
        if (typeof by === "object") {
          options = by;
          by = void 0;
        }
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        const { center = this.mean(by) } = options;
        switch (by) {
          case "row": {
            if (!isAnyArray(center)) {
              throw new TypeError("center must be an array");
            }
            centerByRow(this, center);
            return this;
          }
          case "column": {
            if (!isAnyArray(center)) {
              throw new TypeError("center must be an array");
            }
            centerByColumn(this, center);
            return this;
          }
          case void 0: {
            if (typeof center !== "number") {
              throw new TypeError("center must be a number");
            }
            centerAll(this, center);
            return this;
          }
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      scale(by, options = {}) {
        if (typeof by === "object") {
          options = by;
          by = void 0;
        }
        if (typeof options !== "object") {
          throw new TypeError("options must be an object");
        }
        let scale = options.scale;
        switch (by) {
          case "row": {
            if (scale === void 0) {
              scale = getScaleByRow(this);
            } else if (!isAnyArray(scale)) {
              throw new TypeError("scale must be an array");
            }
            scaleByRow(this, scale);
            return this;
          }
          case "column": {
            if (scale === void 0) {
              scale = getScaleByColumn(this);
            } else if (!isAnyArray(scale)) {
              throw new TypeError("scale must be an array");
            }
            scaleByColumn(this, scale);
            return this;
          }
          case void 0: {
            if (scale === void 0) {
              scale = getScaleAll(this);
            } else if (typeof scale !== "number") {
              throw new TypeError("scale must be a number");
            }
            scaleAll(this, scale);
            return this;
          }
          default:
            throw new Error(`invalid option: ${by}`);
        }
      }
      toString(options) {
        return inspectMatrixWithOptions(this, options);
      }
      [Symbol.iterator]() {
        return this.entries();
      }
      /**
       * iterator from left to right, from top to bottom
       * yield [row, column, value]
       * @returns {Generator<[number, number, number], void, void>}
       */
      *entries() {
        for (let row = 0; row < this.rows; row++) {
          for (let col = 0; col < this.columns; col++) {
            yield [row, col, this.get(row, col)];
          }
        }
      }
      /**
       * iterator from left to right, from top to bottom
       * yield value
       * @returns {Generator<number, void, void>}
       */
      *values() {
        for (let row = 0; row < this.rows; row++) {
          for (let col = 0; col < this.columns; col++) {
            yield this.get(row, col);
          }
        }
      }
    };
    AbstractMatrix2.prototype.klass = "Matrix";
    if (typeof Symbol !== "undefined") {
      AbstractMatrix2.prototype[/* @__PURE__ */ Symbol.for("nodejs.util.inspect.custom")] = inspectMatrix;
    }
    function compareNumbers(a, b) {
      return a - b;
    }
    function isArrayOfNumbers(array) {
      return array.every((element) => {
        return typeof element === "number";
      });
    }
    AbstractMatrix2.random = AbstractMatrix2.rand;
    AbstractMatrix2.randomInt = AbstractMatrix2.randInt;
    AbstractMatrix2.diagonal = AbstractMatrix2.diag;
    AbstractMatrix2.prototype.diagonal = AbstractMatrix2.prototype.diag;
    AbstractMatrix2.identity = AbstractMatrix2.eye;
    AbstractMatrix2.prototype.negate = AbstractMatrix2.prototype.neg;
    AbstractMatrix2.prototype.tensorProduct = AbstractMatrix2.prototype.kroneckerProduct;
    var Matrix3 = class _Matrix extends AbstractMatrix2 {
      /**
       * @type {Float64Array[]}
       */
      data;
      /**
       * Init an empty matrix
       * @param {number} nRows
       * @param {number} nColumns
       */
      #initData(nRows, nColumns) {
        this.data = [];
        if (Number.isInteger(nColumns) && nColumns >= 0) {
          for (let i = 0; i < nRows; i++) {
            this.data.push(new Float64Array(nColumns));
          }
        } else {
          throw new TypeError("nColumns must be a positive integer");
        }
        this.rows = nRows;
        this.columns = nColumns;
      }
      constructor(nRows, nColumns) {
        super();
        if (_Matrix.isMatrix(nRows)) {
          this.#initData(nRows.rows, nRows.columns);
          _Matrix.copy(nRows, this);
        } else if (Number.isInteger(nRows) && nRows >= 0) {
          this.#initData(nRows, nColumns);
        } else if (isAnyArray(nRows)) {
          const arrayData = nRows;
          nRows = arrayData.length;
          nColumns = nRows ? arrayData[0].length : 0;
          if (typeof nColumns !== "number") {
            throw new TypeError(
              "Data must be a 2D array with at least one element"
            );
          }
          this.data = [];
          for (let i = 0; i < nRows; i++) {
            if (arrayData[i].length !== nColumns) {
              throw new RangeError("Inconsistent array dimensions");
            }
            if (!isArrayOfNumbers(arrayData[i])) {
              throw new TypeError("Input data contains non-numeric values");
            }
            this.data.push(Float64Array.from(arrayData[i]));
          }
          this.rows = nRows;
          this.columns = nColumns;
        } else {
          throw new TypeError(
            "First argument must be a positive number or an array"
          );
        }
      }
      set(rowIndex, columnIndex, value) {
        this.data[rowIndex][columnIndex] = value;
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.data[rowIndex][columnIndex];
      }
      removeRow(index2) {
        checkRowIndex(this, index2);
        this.data.splice(index2, 1);
        this.rows -= 1;
        return this;
      }
      addRow(index2, array) {
        if (array === void 0) {
          array = index2;
          index2 = this.rows;
        }
        checkRowIndex(this, index2, true);
        array = Float64Array.from(checkRowVector(this, array));
        this.data.splice(index2, 0, array);
        this.rows += 1;
        return this;
      }
      removeColumn(index2) {
        checkColumnIndex(this, index2);
        for (let i = 0; i < this.rows; i++) {
          const newRow = new Float64Array(this.columns - 1);
          for (let j = 0; j < index2; j++) {
            newRow[j] = this.data[i][j];
          }
          for (let j = index2 + 1; j < this.columns; j++) {
            newRow[j - 1] = this.data[i][j];
          }
          this.data[i] = newRow;
        }
        this.columns -= 1;
        return this;
      }
      addColumn(index2, array) {
        if (typeof array === "undefined") {
          array = index2;
          index2 = this.columns;
        }
        checkColumnIndex(this, index2, true);
        array = checkColumnVector(this, array);
        for (let i = 0; i < this.rows; i++) {
          const newRow = new Float64Array(this.columns + 1);
          let j = 0;
          for (; j < index2; j++) {
            newRow[j] = this.data[i][j];
          }
          newRow[j++] = array[i];
          for (; j < this.columns + 1; j++) {
            newRow[j] = this.data[i][j - 1];
          }
          this.data[i] = newRow;
        }
        this.columns += 1;
        return this;
      }
    };
    installMathOperations(AbstractMatrix2, Matrix3);
    var SymmetricMatrix2 = class _SymmetricMatrix extends AbstractMatrix2 {
      /** @type {Matrix} */
      #matrix;
      get size() {
        return this.#matrix.size;
      }
      get rows() {
        return this.#matrix.rows;
      }
      get columns() {
        return this.#matrix.columns;
      }
      get diagonalSize() {
        return this.rows;
      }
      /**
       * not the same as matrix.isSymmetric()
       * Here is to check if it's instanceof SymmetricMatrix without bundling issues
       *
       * @param value
       * @returns {boolean}
       */
      static isSymmetricMatrix(value) {
        return Matrix3.isMatrix(value) && value.klassType === "SymmetricMatrix";
      }
      /**
       * @param diagonalSize
       * @return {SymmetricMatrix}
       */
      static zeros(diagonalSize) {
        return new this(diagonalSize);
      }
      /**
       * @param diagonalSize
       * @return {SymmetricMatrix}
       */
      static ones(diagonalSize) {
        return new this(diagonalSize).fill(1);
      }
      /**
       * @param {number | AbstractMatrix | ArrayLike<ArrayLike<number>>} diagonalSize
       * @return {this}
       */
      constructor(diagonalSize) {
        super();
        if (Matrix3.isMatrix(diagonalSize)) {
          if (!diagonalSize.isSymmetric()) {
            throw new TypeError("not symmetric data");
          }
          this.#matrix = Matrix3.copy(
            diagonalSize,
            new Matrix3(diagonalSize.rows, diagonalSize.rows)
          );
        } else if (Number.isInteger(diagonalSize) && diagonalSize >= 0) {
          this.#matrix = new Matrix3(diagonalSize, diagonalSize);
        } else {
          this.#matrix = new Matrix3(diagonalSize);
          if (!this.isSymmetric()) {
            throw new TypeError("not symmetric data");
          }
        }
      }
      clone() {
        const matrix2 = new _SymmetricMatrix(this.diagonalSize);
        for (const [row, col, value] of this.upperRightEntries()) {
          matrix2.set(row, col, value);
        }
        return matrix2;
      }
      toMatrix() {
        return new Matrix3(this);
      }
      get(rowIndex, columnIndex) {
        return this.#matrix.get(rowIndex, columnIndex);
      }
      set(rowIndex, columnIndex, value) {
        this.#matrix.set(rowIndex, columnIndex, value);
        this.#matrix.set(columnIndex, rowIndex, value);
        return this;
      }
      removeCross(index2) {
        this.#matrix.removeRow(index2);
        this.#matrix.removeColumn(index2);
        return this;
      }
      addCross(index2, array) {
        if (array === void 0) {
          array = index2;
          index2 = this.diagonalSize;
        }
        const row = array.slice();
        row.splice(index2, 1);
        this.#matrix.addRow(index2, row);
        this.#matrix.addColumn(index2, array);
        return this;
      }
      /**
       * @param {Mask[]} mask
       */
      applyMask(mask) {
        if (mask.length !== this.diagonalSize) {
          throw new RangeError("Mask size do not match with matrix size");
        }
        const sidesToRemove = [];
        for (const [index2, passthroughs] of mask.entries()) {
          if (passthroughs) continue;
          sidesToRemove.push(index2);
        }
        sidesToRemove.reverse();
        for (const sideIndex of sidesToRemove) {
          this.removeCross(sideIndex);
        }
        return this;
      }
      /**
       * Compact format upper-right corner of matrix
       * iterate from left to right, from top to bottom.
       *
       * ```
       *   A B C D
       * A 1 2 3 4
       * B 2 5 6 7
       * C 3 6 8 9
       * D 4 7 9 10
       * ```
       *
       * will return compact 1D array `[1, 2, 3, 4, 5, 6, 7, 8, 9, 10]`
       *
       * length is S(i=0, n=sideSize) => 10 for a 4 sideSized matrix
       *
       * @returns {number[]}
       */
      toCompact() {
        const { diagonalSize } = this;
        const compact = new Array(diagonalSize * (diagonalSize + 1) / 2);
        for (let col = 0, row = 0, index2 = 0; index2 < compact.length; index2++) {
          compact[index2] = this.get(row, col);
          if (++col >= diagonalSize) col = ++row;
        }
        return compact;
      }
      /**
       * @param {number[]} compact
       * @return {SymmetricMatrix}
       */
      static fromCompact(compact) {
        const compactSize = compact.length;
        const diagonalSize = (Math.sqrt(8 * compactSize + 1) - 1) / 2;
        if (!Number.isInteger(diagonalSize)) {
          throw new TypeError(
            `This array is not a compact representation of a Symmetric Matrix, ${JSON.stringify(
              compact
            )}`
          );
        }
        const matrix2 = new _SymmetricMatrix(diagonalSize);
        for (let col = 0, row = 0, index2 = 0; index2 < compactSize; index2++) {
          matrix2.set(col, row, compact[index2]);
          if (++col >= diagonalSize) col = ++row;
        }
        return matrix2;
      }
      /**
       * half iterator upper-right-corner from left to right, from top to bottom
       * yield [row, column, value]
       *
       * @returns {Generator<[number, number, number], void, void>}
       */
      *upperRightEntries() {
        for (let row = 0, col = 0; row < this.diagonalSize; void 0) {
          const value = this.get(row, col);
          yield [row, col, value];
          if (++col >= this.diagonalSize) col = ++row;
        }
      }
      /**
       * half iterator upper-right-corner from left to right, from top to bottom
       * yield value
       *
       * @returns {Generator<[number, number, number], void, void>}
       */
      *upperRightValues() {
        for (let row = 0, col = 0; row < this.diagonalSize; void 0) {
          const value = this.get(row, col);
          yield value;
          if (++col >= this.diagonalSize) col = ++row;
        }
      }
    };
    SymmetricMatrix2.prototype.klassType = "SymmetricMatrix";
    var DistanceMatrix2 = class _DistanceMatrix extends SymmetricMatrix2 {
      /**
       * not the same as matrix.isSymmetric()
       * Here is to check if it's instanceof SymmetricMatrix without bundling issues
       *
       * @param value
       * @returns {boolean}
       */
      static isDistanceMatrix(value) {
        return SymmetricMatrix2.isSymmetricMatrix(value) && value.klassSubType === "DistanceMatrix";
      }
      constructor(sideSize) {
        super(sideSize);
        if (!this.isDistance()) {
          throw new TypeError("Provided arguments do no produce a distance matrix");
        }
      }
      set(rowIndex, columnIndex, value) {
        if (rowIndex === columnIndex) value = 0;
        return super.set(rowIndex, columnIndex, value);
      }
      addCross(index2, array) {
        if (array === void 0) {
          array = index2;
          index2 = this.diagonalSize;
        }
        array = array.slice();
        array[index2] = 0;
        return super.addCross(index2, array);
      }
      toSymmetricMatrix() {
        return new SymmetricMatrix2(this);
      }
      clone() {
        const matrix2 = new _DistanceMatrix(this.diagonalSize);
        for (const [row, col, value] of this.upperRightEntries()) {
          if (row === col) continue;
          matrix2.set(row, col, value);
        }
        return matrix2;
      }
      /**
       * Compact format upper-right corner of matrix
       * no diagonal (only zeros)
       * iterable from left to right, from top to bottom.
       *
       * ```
       *   A B C D
       * A 0 1 2 3
       * B 1 0 4 5
       * C 2 4 0 6
       * D 3 5 6 0
       * ```
       *
       * will return compact 1D array `[1, 2, 3, 4, 5, 6]`
       *
       * length is S(i=0, n=sideSize-1) => 6 for a 4 side sized matrix
       *
       * @returns {number[]}
       */
      toCompact() {
        const { diagonalSize } = this;
        const compactLength = (diagonalSize - 1) * diagonalSize / 2;
        const compact = new Array(compactLength);
        for (let col = 1, row = 0, index2 = 0; index2 < compact.length; index2++) {
          compact[index2] = this.get(row, col);
          if (++col >= diagonalSize) col = ++row + 1;
        }
        return compact;
      }
      /**
       * @param {number[]} compact
       */
      static fromCompact(compact) {
        const compactSize = compact.length;
        if (compactSize === 0) {
          return new this(0);
        }
        const diagonalSize = (Math.sqrt(8 * compactSize + 1) + 1) / 2;
        if (!Number.isInteger(diagonalSize)) {
          throw new TypeError(
            `This array is not a compact representation of a DistanceMatrix, ${JSON.stringify(
              compact
            )}`
          );
        }
        const matrix2 = new this(diagonalSize);
        for (let col = 1, row = 0, index2 = 0; index2 < compactSize; index2++) {
          matrix2.set(col, row, compact[index2]);
          if (++col >= diagonalSize) col = ++row + 1;
        }
        return matrix2;
      }
    };
    DistanceMatrix2.prototype.klassSubType = "DistanceMatrix";
    var BaseView = class extends AbstractMatrix2 {
      constructor(matrix2, rows, columns) {
        super();
        this.matrix = matrix2;
        this.rows = rows;
        this.columns = columns;
      }
    };
    var MatrixColumnView2 = class extends BaseView {
      constructor(matrix2, column) {
        checkColumnIndex(matrix2, column);
        super(matrix2, matrix2.rows, 1);
        this.column = column;
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(rowIndex, this.column, value);
        return this;
      }
      get(rowIndex) {
        return this.matrix.get(rowIndex, this.column);
      }
    };
    var MatrixColumnSelectionView2 = class extends BaseView {
      constructor(matrix2, columnIndices) {
        checkColumnIndices(matrix2, columnIndices);
        super(matrix2, matrix2.rows, columnIndices.length);
        this.columnIndices = columnIndices;
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(rowIndex, this.columnIndices[columnIndex], value);
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(rowIndex, this.columnIndices[columnIndex]);
      }
    };
    var MatrixFlipColumnView2 = class extends BaseView {
      constructor(matrix2) {
        super(matrix2, matrix2.rows, matrix2.columns);
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(rowIndex, this.columns - columnIndex - 1, value);
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(rowIndex, this.columns - columnIndex - 1);
      }
    };
    var MatrixFlipRowView2 = class extends BaseView {
      constructor(matrix2) {
        super(matrix2, matrix2.rows, matrix2.columns);
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(this.rows - rowIndex - 1, columnIndex, value);
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(this.rows - rowIndex - 1, columnIndex);
      }
    };
    var MatrixRowView2 = class extends BaseView {
      constructor(matrix2, row) {
        checkRowIndex(matrix2, row);
        super(matrix2, 1, matrix2.columns);
        this.row = row;
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(this.row, columnIndex, value);
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(this.row, columnIndex);
      }
    };
    var MatrixRowSelectionView2 = class extends BaseView {
      constructor(matrix2, rowIndices) {
        checkRowIndices(matrix2, rowIndices);
        super(matrix2, rowIndices.length, matrix2.columns);
        this.rowIndices = rowIndices;
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(this.rowIndices[rowIndex], columnIndex, value);
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(this.rowIndices[rowIndex], columnIndex);
      }
    };
    var MatrixSelectionView2 = class extends BaseView {
      constructor(matrix2, rowIndices, columnIndices) {
        checkRowIndices(matrix2, rowIndices);
        checkColumnIndices(matrix2, columnIndices);
        super(matrix2, rowIndices.length, columnIndices.length);
        this.rowIndices = rowIndices;
        this.columnIndices = columnIndices;
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(
          this.rowIndices[rowIndex],
          this.columnIndices[columnIndex],
          value
        );
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(
          this.rowIndices[rowIndex],
          this.columnIndices[columnIndex]
        );
      }
    };
    var MatrixSubView2 = class extends BaseView {
      constructor(matrix2, startRow, endRow, startColumn, endColumn) {
        checkRange(matrix2, startRow, endRow, startColumn, endColumn);
        super(matrix2, endRow - startRow + 1, endColumn - startColumn + 1);
        this.startRow = startRow;
        this.startColumn = startColumn;
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(
          this.startRow + rowIndex,
          this.startColumn + columnIndex,
          value
        );
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(
          this.startRow + rowIndex,
          this.startColumn + columnIndex
        );
      }
    };
    var MatrixTransposeView2 = class extends BaseView {
      constructor(matrix2) {
        super(matrix2, matrix2.columns, matrix2.rows);
      }
      set(rowIndex, columnIndex, value) {
        this.matrix.set(columnIndex, rowIndex, value);
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.matrix.get(columnIndex, rowIndex);
      }
    };
    var WrapperMatrix1D2 = class extends AbstractMatrix2 {
      constructor(data, options = {}) {
        const { rows = 1 } = options;
        if (data.length % rows !== 0) {
          throw new Error("the data length is not divisible by the number of rows");
        }
        super();
        this.rows = rows;
        this.columns = data.length / rows;
        this.data = data;
      }
      set(rowIndex, columnIndex, value) {
        let index2 = this._calculateIndex(rowIndex, columnIndex);
        this.data[index2] = value;
        return this;
      }
      get(rowIndex, columnIndex) {
        let index2 = this._calculateIndex(rowIndex, columnIndex);
        return this.data[index2];
      }
      _calculateIndex(row, column) {
        return row * this.columns + column;
      }
    };
    var WrapperMatrix2D2 = class extends AbstractMatrix2 {
      constructor(data) {
        super();
        this.data = data;
        this.rows = data.length;
        this.columns = data[0].length;
      }
      set(rowIndex, columnIndex, value) {
        this.data[rowIndex][columnIndex] = value;
        return this;
      }
      get(rowIndex, columnIndex) {
        return this.data[rowIndex][columnIndex];
      }
    };
    function wrap2(array, options) {
      if (isAnyArray(array)) {
        if (array[0] && isAnyArray(array[0])) {
          return new WrapperMatrix2D2(array);
        } else {
          return new WrapperMatrix1D2(array, options);
        }
      } else {
        throw new Error("the argument is not an array");
      }
    }
    var LuDecomposition2 = class {
      constructor(matrix2) {
        matrix2 = WrapperMatrix2D2.checkMatrix(matrix2);
        let lu = matrix2.clone();
        let rows = lu.rows;
        let columns = lu.columns;
        let pivotVector = new Float64Array(rows);
        let pivotSign = 1;
        let i, j, k, p, s, t, v;
        let LUcolj, kmax;
        for (i = 0; i < rows; i++) {
          pivotVector[i] = i;
        }
        LUcolj = new Float64Array(rows);
        for (j = 0; j < columns; j++) {
          for (i = 0; i < rows; i++) {
            LUcolj[i] = lu.get(i, j);
          }
          for (i = 0; i < rows; i++) {
            kmax = Math.min(i, j);
            s = 0;
            for (k = 0; k < kmax; k++) {
              s += lu.get(i, k) * LUcolj[k];
            }
            LUcolj[i] -= s;
            lu.set(i, j, LUcolj[i]);
          }
          p = j;
          for (i = j + 1; i < rows; i++) {
            if (Math.abs(LUcolj[i]) > Math.abs(LUcolj[p])) {
              p = i;
            }
          }
          if (p !== j) {
            for (k = 0; k < columns; k++) {
              t = lu.get(p, k);
              lu.set(p, k, lu.get(j, k));
              lu.set(j, k, t);
            }
            v = pivotVector[p];
            pivotVector[p] = pivotVector[j];
            pivotVector[j] = v;
            pivotSign = -pivotSign;
          }
          if (j < rows && lu.get(j, j) !== 0) {
            for (i = j + 1; i < rows; i++) {
              lu.set(i, j, lu.get(i, j) / lu.get(j, j));
            }
          }
        }
        this.LU = lu;
        this.pivotVector = pivotVector;
        this.pivotSign = pivotSign;
      }
      isSingular() {
        let data = this.LU;
        let col = data.columns;
        for (let j = 0; j < col; j++) {
          if (data.get(j, j) === 0) {
            return true;
          }
        }
        return false;
      }
      solve(value) {
        value = Matrix3.checkMatrix(value);
        let lu = this.LU;
        let rows = lu.rows;
        if (rows !== value.rows) {
          throw new Error("Invalid matrix dimensions");
        }
        if (this.isSingular()) {
          throw new Error("LU matrix is singular");
        }
        let count = value.columns;
        let X = value.subMatrixRow(this.pivotVector, 0, count - 1);
        let columns = lu.columns;
        let i, j, k;
        for (k = 0; k < columns; k++) {
          for (i = k + 1; i < columns; i++) {
            for (j = 0; j < count; j++) {
              X.set(i, j, X.get(i, j) - X.get(k, j) * lu.get(i, k));
            }
          }
        }
        for (k = columns - 1; k >= 0; k--) {
          for (j = 0; j < count; j++) {
            X.set(k, j, X.get(k, j) / lu.get(k, k));
          }
          for (i = 0; i < k; i++) {
            for (j = 0; j < count; j++) {
              X.set(i, j, X.get(i, j) - X.get(k, j) * lu.get(i, k));
            }
          }
        }
        return X;
      }
      get determinant() {
        let data = this.LU;
        if (!data.isSquare()) {
          throw new Error("Matrix must be square");
        }
        let determinant3 = this.pivotSign;
        let col = data.columns;
        for (let j = 0; j < col; j++) {
          determinant3 *= data.get(j, j);
        }
        return determinant3;
      }
      get lowerTriangularMatrix() {
        let data = this.LU;
        let rows = data.rows;
        let columns = data.columns;
        let X = new Matrix3(rows, columns);
        for (let i = 0; i < rows; i++) {
          for (let j = 0; j < columns; j++) {
            if (i > j) {
              X.set(i, j, data.get(i, j));
            } else if (i === j) {
              X.set(i, j, 1);
            } else {
              X.set(i, j, 0);
            }
          }
        }
        return X;
      }
      get upperTriangularMatrix() {
        let data = this.LU;
        let rows = data.rows;
        let columns = data.columns;
        let X = new Matrix3(rows, columns);
        for (let i = 0; i < rows; i++) {
          for (let j = 0; j < columns; j++) {
            if (i <= j) {
              X.set(i, j, data.get(i, j));
            } else {
              X.set(i, j, 0);
            }
          }
        }
        return X;
      }
      get pivotPermutationVector() {
        return Array.from(this.pivotVector);
      }
    };
    function transposeSquareInPlace(matrix2) {
      const data = matrix2.data;
      const n2 = matrix2.rows;
      for (let i = 0; i < n2; i++) {
        const rowI = data[i];
        for (let j = i + 1; j < n2; j++) {
          const tmp = rowI[j];
          rowI[j] = data[j][i];
          data[j][i] = tmp;
        }
      }
      return matrix2;
    }
    function hypotenuse(a, b) {
      let r = 0;
      if (Math.abs(a) > Math.abs(b)) {
        r = b / a;
        return Math.abs(a) * Math.sqrt(1 + r * r);
      }
      if (b !== 0) {
        r = a / b;
        return Math.abs(b) * Math.sqrt(1 + r * r);
      }
      return 0;
    }
    var QrDecomposition2 = class {
      constructor(value) {
        value = WrapperMatrix2D2.checkMatrix(value);
        let qr = value.clone();
        let m = value.rows;
        let n2 = value.columns;
        let rdiag = new Float64Array(n2);
        let i, j, k, s;
        for (k = 0; k < n2; k++) {
          let nrm = 0;
          for (i = k; i < m; i++) {
            nrm = hypotenuse(nrm, qr.get(i, k));
          }
          if (nrm !== 0) {
            if (qr.get(k, k) < 0) {
              nrm = -nrm;
            }
            for (i = k; i < m; i++) {
              qr.set(i, k, qr.get(i, k) / nrm);
            }
            qr.set(k, k, qr.get(k, k) + 1);
            for (j = k + 1; j < n2; j++) {
              s = 0;
              for (i = k; i < m; i++) {
                s += qr.get(i, k) * qr.get(i, j);
              }
              s = -s / qr.get(k, k);
              for (i = k; i < m; i++) {
                qr.set(i, j, qr.get(i, j) + s * qr.get(i, k));
              }
            }
          }
          rdiag[k] = -nrm;
        }
        this.QR = qr;
        this.Rdiag = rdiag;
      }
      solve(value) {
        value = Matrix3.checkMatrix(value);
        let qr = this.QR;
        let m = qr.rows;
        if (value.rows !== m) {
          throw new Error("Matrix row dimensions must agree");
        }
        if (!this.isFullRank()) {
          throw new Error("Matrix is rank deficient");
        }
        let count = value.columns;
        let X = value.clone();
        let n2 = qr.columns;
        let i, j, k, s;
        for (k = 0; k < n2; k++) {
          for (j = 0; j < count; j++) {
            s = 0;
            for (i = k; i < m; i++) {
              s += qr.get(i, k) * X.get(i, j);
            }
            s = -s / qr.get(k, k);
            for (i = k; i < m; i++) {
              X.set(i, j, X.get(i, j) + s * qr.get(i, k));
            }
          }
        }
        for (k = n2 - 1; k >= 0; k--) {
          for (j = 0; j < count; j++) {
            X.set(k, j, X.get(k, j) / this.Rdiag[k]);
          }
          for (i = 0; i < k; i++) {
            for (j = 0; j < count; j++) {
              X.set(i, j, X.get(i, j) - X.get(k, j) * qr.get(i, k));
            }
          }
        }
        return X.subMatrix(0, n2 - 1, 0, count - 1);
      }
      isFullRank() {
        let columns = this.QR.columns;
        for (let i = 0; i < columns; i++) {
          if (this.Rdiag[i] === 0) {
            return false;
          }
        }
        return true;
      }
      get upperTriangularMatrix() {
        let qr = this.QR;
        let n2 = qr.columns;
        let X = new Matrix3(n2, n2);
        let i, j;
        for (i = 0; i < n2; i++) {
          for (j = 0; j < n2; j++) {
            if (i < j) {
              X.set(i, j, qr.get(i, j));
            } else if (i === j) {
              X.set(i, j, this.Rdiag[i]);
            } else {
              X.set(i, j, 0);
            }
          }
        }
        return X;
      }
      get orthogonalMatrix() {
        let qr = this.QR;
        let rows = qr.rows;
        let columns = qr.columns;
        let X = new Matrix3(rows, columns);
        let i, j, k, s;
        for (k = columns - 1; k >= 0; k--) {
          for (i = 0; i < rows; i++) {
            X.set(i, k, 0);
          }
          X.set(k, k, 1);
          for (j = k; j < columns; j++) {
            if (qr.get(k, k) !== 0) {
              s = 0;
              for (i = k; i < rows; i++) {
                s += qr.get(i, k) * X.get(i, j);
              }
              s = -s / qr.get(k, k);
              for (i = k; i < rows; i++) {
                X.set(i, j, X.get(i, j) + s * qr.get(i, k));
              }
            }
          }
        }
        return X;
      }
    };
    var SingularValueDecomposition2 = class {
      constructor(value, options = {}) {
        value = WrapperMatrix2D2.checkMatrix(value);
        if (value.isEmpty()) {
          throw new Error("Matrix must be non-empty");
        }
        let m = value.rows;
        let n2 = value.columns;
        const {
          computeLeftSingularVectors = true,
          computeRightSingularVectors = true,
          autoTranspose = false
        } = options;
        let wantu = Boolean(computeLeftSingularVectors);
        let wantv = Boolean(computeRightSingularVectors);
        let swapped = false;
        let at;
        if (m < n2) {
          if (!autoTranspose) {
            console.warn(
              "Computing SVD on a matrix with more columns than rows. Consider enabling autoTranspose"
            );
            at = value.transpose();
          } else {
            at = value.clone();
            m = value.columns;
            n2 = value.rows;
            swapped = true;
            let aux = wantu;
            wantu = wantv;
            wantv = aux;
          }
        } else {
          at = value.transpose();
        }
        let nu = Math.min(m, n2);
        let ni = Math.min(m + 1, n2);
        let s = new Float64Array(ni);
        let U = new Matrix3(nu, m);
        let V = new Matrix3(n2, n2);
        let e = new Float64Array(n2);
        let work = new Float64Array(m);
        let si = new Float64Array(ni);
        for (let i = 0; i < ni; i++) si[i] = i;
        let nct = Math.min(m - 1, n2);
        let nrt = Math.max(0, Math.min(n2 - 2, m));
        let mrc = Math.max(nct, nrt);
        for (let k = 0; k < mrc; k++) {
          if (k < nct) {
            s[k] = 0;
            for (let i = k; i < m; i++) {
              s[k] = hypotenuse(s[k], at.get(k, i));
            }
            if (s[k] !== 0) {
              if (at.get(k, k) < 0) {
                s[k] = -s[k];
              }
              for (let i = k; i < m; i++) {
                at.set(k, i, at.get(k, i) / s[k]);
              }
              at.set(k, k, at.get(k, k) + 1);
            }
            s[k] = -s[k];
          }
          for (let j = k + 1; j < n2; j++) {
            if (k < nct && s[k] !== 0) {
              let t = 0;
              for (let i = k; i < m; i++) {
                t += at.get(k, i) * at.get(j, i);
              }
              t = -t / at.get(k, k);
              for (let i = k; i < m; i++) {
                at.set(j, i, at.get(j, i) + t * at.get(k, i));
              }
            }
            e[j] = at.get(j, k);
          }
          if (wantu && k < nct) {
            for (let i = k; i < m; i++) {
              U.set(k, i, at.get(k, i));
            }
          }
          if (k < nrt) {
            e[k] = 0;
            for (let i = k + 1; i < n2; i++) {
              e[k] = hypotenuse(e[k], e[i]);
            }
            if (e[k] !== 0) {
              if (e[k + 1] < 0) {
                e[k] = 0 - e[k];
              }
              for (let i = k + 1; i < n2; i++) {
                e[i] /= e[k];
              }
              e[k + 1] += 1;
            }
            e[k] = -e[k];
            if (k + 1 < m && e[k] !== 0) {
              for (let i = k + 1; i < m; i++) {
                work[i] = 0;
              }
              for (let i = k + 1; i < m; i++) {
                for (let j = k + 1; j < n2; j++) {
                  work[i] += e[j] * at.get(j, i);
                }
              }
              for (let j = k + 1; j < n2; j++) {
                let t = -e[j] / e[k + 1];
                for (let i = k + 1; i < m; i++) {
                  at.set(j, i, at.get(j, i) + t * work[i]);
                }
              }
            }
            if (wantv) {
              for (let i = k + 1; i < n2; i++) {
                V.set(k, i, e[i]);
              }
            }
          }
        }
        let p = Math.min(n2, m + 1);
        if (nct < n2) {
          s[nct] = at.get(nct, nct);
        }
        if (m < p) {
          s[p - 1] = 0;
        }
        if (nrt + 1 < p) {
          e[nrt] = at.get(p - 1, nrt);
        }
        e[p - 1] = 0;
        if (wantu) {
          for (let j = nct; j < nu; j++) {
            for (let i = 0; i < m; i++) {
              U.set(j, i, 0);
            }
            U.set(j, j, 1);
          }
          for (let k = nct - 1; k >= 0; k--) {
            if (s[k] !== 0) {
              for (let j = k + 1; j < nu; j++) {
                let t = 0;
                for (let i = k; i < m; i++) {
                  t += U.get(k, i) * U.get(j, i);
                }
                t = -t / U.get(k, k);
                for (let i = k; i < m; i++) {
                  U.set(j, i, U.get(j, i) + t * U.get(k, i));
                }
              }
              for (let i = k; i < m; i++) {
                U.set(k, i, -U.get(k, i));
              }
              U.set(k, k, 1 + U.get(k, k));
              for (let i = 0; i < k - 1; i++) {
                U.set(k, i, 0);
              }
            } else {
              for (let i = 0; i < m; i++) {
                U.set(k, i, 0);
              }
              U.set(k, k, 1);
            }
          }
        }
        if (wantv) {
          for (let k = n2 - 1; k >= 0; k--) {
            if (k < nrt && e[k] !== 0) {
              for (let j = k + 1; j < n2; j++) {
                let t = 0;
                for (let i = k + 1; i < n2; i++) {
                  t += V.get(k, i) * V.get(j, i);
                }
                t = -t / V.get(k, k + 1);
                for (let i = k + 1; i < n2; i++) {
                  V.set(j, i, V.get(j, i) + t * V.get(k, i));
                }
              }
            }
            for (let i = 0; i < n2; i++) {
              V.set(k, i, 0);
            }
            V.set(k, k, 1);
          }
        }
        let pp = p - 1;
        let eps = Number.EPSILON;
        while (p > 0) {
          let k, kase;
          for (k = p - 2; k >= -1; k--) {
            if (k === -1) {
              break;
            }
            const alpha = Number.MIN_VALUE + eps * Math.abs(s[k] + Math.abs(s[k + 1]));
            if (Math.abs(e[k]) <= alpha || Number.isNaN(e[k])) {
              e[k] = 0;
              break;
            }
          }
          if (k === p - 2) {
            kase = 4;
          } else {
            let ks;
            for (ks = p - 1; ks >= k; ks--) {
              if (ks === k) {
                break;
              }
              let t = (ks !== p ? Math.abs(e[ks]) : 0) + (ks !== k + 1 ? Math.abs(e[ks - 1]) : 0);
              if (Math.abs(s[ks]) <= eps * t) {
                s[ks] = 0;
                break;
              }
            }
            if (ks === k) {
              kase = 3;
            } else if (ks === p - 1) {
              kase = 1;
            } else {
              kase = 2;
              k = ks;
            }
          }
          k++;
          switch (kase) {
            case 1: {
              let f = e[p - 2];
              e[p - 2] = 0;
              for (let j = p - 2; j >= k; j--) {
                let t = hypotenuse(s[j], f);
                let cs = s[j] / t;
                let sn = f / t;
                s[j] = t;
                if (j !== k) {
                  f = -sn * e[j - 1];
                  e[j - 1] = cs * e[j - 1];
                }
                if (wantv) {
                  for (let i = 0; i < n2; i++) {
                    t = cs * V.get(j, i) + sn * V.get(p - 1, i);
                    V.set(p - 1, i, -sn * V.get(j, i) + cs * V.get(p - 1, i));
                    V.set(j, i, t);
                  }
                }
              }
              break;
            }
            case 2: {
              let f = e[k - 1];
              e[k - 1] = 0;
              for (let j = k; j < p; j++) {
                let t = hypotenuse(s[j], f);
                let cs = s[j] / t;
                let sn = f / t;
                s[j] = t;
                f = -sn * e[j];
                e[j] = cs * e[j];
                if (wantu) {
                  for (let i = 0; i < m; i++) {
                    t = cs * U.get(j, i) + sn * U.get(k - 1, i);
                    U.set(k - 1, i, -sn * U.get(j, i) + cs * U.get(k - 1, i));
                    U.set(j, i, t);
                  }
                }
              }
              break;
            }
            case 3: {
              const scale = Math.max(
                Math.abs(s[p - 1]),
                Math.abs(s[p - 2]),
                Math.abs(e[p - 2]),
                Math.abs(s[k]),
                Math.abs(e[k])
              );
              const sp = s[p - 1] / scale;
              const spm1 = s[p - 2] / scale;
              const epm1 = e[p - 2] / scale;
              const sk = s[k] / scale;
              const ek = e[k] / scale;
              const b = ((spm1 + sp) * (spm1 - sp) + epm1 * epm1) / 2;
              const c = sp * epm1 * (sp * epm1);
              let shift = 0;
              if (b !== 0 || c !== 0) {
                if (b < 0) {
                  shift = 0 - Math.sqrt(b * b + c);
                } else {
                  shift = Math.sqrt(b * b + c);
                }
                shift = c / (b + shift);
              }
              let f = (sk + sp) * (sk - sp) + shift;
              let g = sk * ek;
              for (let j = k; j < p - 1; j++) {
                let t = hypotenuse(f, g);
                if (t === 0) t = Number.MIN_VALUE;
                let cs = f / t;
                let sn = g / t;
                if (j !== k) {
                  e[j - 1] = t;
                }
                f = cs * s[j] + sn * e[j];
                e[j] = cs * e[j] - sn * s[j];
                g = sn * s[j + 1];
                s[j + 1] = cs * s[j + 1];
                if (wantv) {
                  for (let i = 0; i < n2; i++) {
                    t = cs * V.get(j, i) + sn * V.get(j + 1, i);
                    V.set(j + 1, i, -sn * V.get(j, i) + cs * V.get(j + 1, i));
                    V.set(j, i, t);
                  }
                }
                t = hypotenuse(f, g);
                if (t === 0) t = Number.MIN_VALUE;
                cs = f / t;
                sn = g / t;
                s[j] = t;
                f = cs * e[j] + sn * s[j + 1];
                s[j + 1] = -sn * e[j] + cs * s[j + 1];
                g = sn * e[j + 1];
                e[j + 1] = cs * e[j + 1];
                if (wantu && j < m - 1) {
                  for (let i = 0; i < m; i++) {
                    t = cs * U.get(j, i) + sn * U.get(j + 1, i);
                    U.set(j + 1, i, -sn * U.get(j, i) + cs * U.get(j + 1, i));
                    U.set(j, i, t);
                  }
                }
              }
              e[p - 2] = f;
              break;
            }
            case 4: {
              if (s[k] <= 0) {
                s[k] = s[k] < 0 ? -s[k] : 0;
                if (wantv) {
                  for (let i = 0; i <= pp; i++) {
                    V.set(k, i, -V.get(k, i));
                  }
                }
              }
              while (k < pp) {
                if (s[k] >= s[k + 1]) {
                  break;
                }
                let t = s[k];
                s[k] = s[k + 1];
                s[k + 1] = t;
                if (wantv && k < n2 - 1) {
                  for (let i = 0; i < n2; i++) {
                    t = V.get(k + 1, i);
                    V.set(k + 1, i, V.get(k, i));
                    V.set(k, i, t);
                  }
                }
                if (wantu && k < m - 1) {
                  for (let i = 0; i < m; i++) {
                    t = U.get(k + 1, i);
                    U.set(k + 1, i, U.get(k, i));
                    U.set(k, i, t);
                  }
                }
                k++;
              }
              p--;
              break;
            }
          }
        }
        U = U.isSquare() ? transposeSquareInPlace(U) : U.transpose();
        V = transposeSquareInPlace(V);
        if (swapped) {
          let tmp = V;
          V = U;
          U = tmp;
        }
        this.m = m;
        this.n = n2;
        this.s = s;
        this.U = U;
        this.V = V;
      }
      solve(value) {
        let Y = value;
        let e = this.threshold;
        let scols = this.s.length;
        let Ls = Matrix3.zeros(scols, scols);
        for (let i = 0; i < scols; i++) {
          if (Math.abs(this.s[i]) <= e) {
            Ls.set(i, i, 0);
          } else {
            Ls.set(i, i, 1 / this.s[i]);
          }
        }
        let U = this.U;
        let V = this.rightSingularVectors;
        let VL = V.mmul(Ls);
        let vrows = V.rows;
        let urows = U.rows;
        let VLU = Matrix3.zeros(vrows, urows);
        for (let i = 0; i < vrows; i++) {
          for (let j = 0; j < urows; j++) {
            let sum = 0;
            for (let k = 0; k < scols; k++) {
              sum += VL.get(i, k) * U.get(j, k);
            }
            VLU.set(i, j, sum);
          }
        }
        return VLU.mmul(Y);
      }
      solveForDiagonal(value) {
        return this.solve(Matrix3.diag(value));
      }
      inverse() {
        let V = this.V;
        let e = this.threshold;
        let vrows = V.rows;
        let vcols = V.columns;
        let X = new Matrix3(vrows, this.s.length);
        for (let i = 0; i < vrows; i++) {
          for (let j = 0; j < vcols; j++) {
            if (Math.abs(this.s[j]) > e) {
              X.set(i, j, V.get(i, j) / this.s[j]);
            }
          }
        }
        let U = this.U;
        let urows = U.rows;
        let ucols = U.columns;
        let Y = new Matrix3(vrows, urows);
        for (let i = 0; i < vrows; i++) {
          for (let j = 0; j < urows; j++) {
            let sum = 0;
            for (let k = 0; k < ucols; k++) {
              sum += X.get(i, k) * U.get(j, k);
            }
            Y.set(i, j, sum);
          }
        }
        return Y;
      }
      get condition() {
        return this.s[0] / this.s[Math.min(this.m, this.n) - 1];
      }
      get norm2() {
        return this.s[0];
      }
      get rank() {
        let tol = Math.max(this.m, this.n) * this.s[0] * Number.EPSILON;
        let r = 0;
        let s = this.s;
        for (let i = 0, ii = s.length; i < ii; i++) {
          if (s[i] > tol) {
            r++;
          }
        }
        return r;
      }
      get diagonal() {
        return Array.from(this.s);
      }
      get threshold() {
        return Number.EPSILON / 2 * Math.max(this.m, this.n) * this.s[0];
      }
      get leftSingularVectors() {
        return this.U;
      }
      get rightSingularVectors() {
        return this.V;
      }
      get diagonalMatrix() {
        return Matrix3.diag(this.s);
      }
    };
    function inverse2(matrix2, useSVD = false) {
      matrix2 = WrapperMatrix2D2.checkMatrix(matrix2);
      if (useSVD) {
        return new SingularValueDecomposition2(matrix2).inverse();
      } else {
        return solve2(matrix2, Matrix3.eye(matrix2.rows));
      }
    }
    function solve2(leftHandSide, rightHandSide, useSVD = false) {
      leftHandSide = WrapperMatrix2D2.checkMatrix(leftHandSide);
      rightHandSide = WrapperMatrix2D2.checkMatrix(rightHandSide);
      if (useSVD) {
        return new SingularValueDecomposition2(leftHandSide).solve(rightHandSide);
      } else {
        return leftHandSide.isSquare() ? new LuDecomposition2(leftHandSide).solve(rightHandSide) : new QrDecomposition2(leftHandSide).solve(rightHandSide);
      }
    }
    function determinant2(matrix2) {
      matrix2 = Matrix3.checkMatrix(matrix2);
      if (matrix2.isSquare()) {
        if (matrix2.columns === 0) {
          return 1;
        }
        let a, b, c, d;
        if (matrix2.columns === 2) {
          a = matrix2.get(0, 0);
          b = matrix2.get(0, 1);
          c = matrix2.get(1, 0);
          d = matrix2.get(1, 1);
          return a * d - b * c;
        } else if (matrix2.columns === 3) {
          let subMatrix0, subMatrix1, subMatrix2;
          subMatrix0 = new MatrixSelectionView2(matrix2, [1, 2], [1, 2]);
          subMatrix1 = new MatrixSelectionView2(matrix2, [1, 2], [0, 2]);
          subMatrix2 = new MatrixSelectionView2(matrix2, [1, 2], [0, 1]);
          a = matrix2.get(0, 0);
          b = matrix2.get(0, 1);
          c = matrix2.get(0, 2);
          return a * determinant2(subMatrix0) - b * determinant2(subMatrix1) + c * determinant2(subMatrix2);
        } else {
          return new LuDecomposition2(matrix2).determinant;
        }
      } else {
        throw Error("determinant can only be calculated for a square matrix");
      }
    }
    function xrange(n2, exception) {
      let range = [];
      for (let i = 0; i < n2; i++) {
        if (i !== exception) {
          range.push(i);
        }
      }
      return range;
    }
    function dependenciesOneRow(error, matrix2, index2, thresholdValue = 1e-9, thresholdError = 1e-9) {
      if (error > thresholdError) {
        return new Array(matrix2.rows + 1).fill(0);
      } else {
        let returnArray = matrix2.addRow(index2, [0]);
        for (let i = 0; i < returnArray.rows; i++) {
          if (Math.abs(returnArray.get(i, 0)) < thresholdValue) {
            returnArray.set(i, 0, 0);
          }
        }
        return returnArray.to1DArray();
      }
    }
    function linearDependencies2(matrix2, options = {}) {
      const { thresholdValue = 1e-9, thresholdError = 1e-9 } = options;
      matrix2 = Matrix3.checkMatrix(matrix2);
      let n2 = matrix2.rows;
      let results = new Matrix3(n2, n2);
      for (let i = 0; i < n2; i++) {
        let b = Matrix3.columnVector(matrix2.getRow(i));
        let Abis = matrix2.subMatrixRow(xrange(n2, i)).transpose();
        let svd = new SingularValueDecomposition2(Abis);
        let x = svd.solve(b);
        let scale = Matrix3.abs(b).max() || 1;
        let error = Matrix3.sub(b, Abis.mmul(x)).abs().max() / scale;
        results.setRow(
          i,
          dependenciesOneRow(error, x, i, thresholdValue, thresholdError)
        );
      }
      return results;
    }
    function pseudoInverse2(matrix2, threshold = Number.EPSILON) {
      matrix2 = Matrix3.checkMatrix(matrix2);
      if (matrix2.isEmpty()) {
        return matrix2.transpose();
      }
      let svdSolution = new SingularValueDecomposition2(matrix2, { autoTranspose: true });
      let U = svdSolution.leftSingularVectors;
      let V = svdSolution.rightSingularVectors;
      let s = svdSolution.diagonal;
      const cutoff = threshold * Math.max(matrix2.rows, matrix2.columns) * s[0];
      for (let i = 0; i < s.length; i++) {
        if (Math.abs(s[i]) > cutoff) {
          s[i] = 1 / s[i];
        } else {
          s[i] = 0;
        }
      }
      return V.mmul(Matrix3.diag(s).mmul(U.transpose()));
    }
    function covariance2(xMatrix, yMatrix = xMatrix, options = {}) {
      xMatrix = new Matrix3(xMatrix);
      let yIsSame = false;
      if (typeof yMatrix === "object" && !Matrix3.isMatrix(yMatrix) && !isAnyArray(yMatrix)) {
        options = yMatrix;
        yMatrix = xMatrix;
        yIsSame = true;
      } else {
        yMatrix = new Matrix3(yMatrix);
      }
      if (xMatrix.rows !== yMatrix.rows) {
        throw new TypeError("Both matrices must have the same number of rows");
      }
      const { center = true } = options;
      if (center) {
        xMatrix = xMatrix.center("column");
        if (!yIsSame) {
          yMatrix = yMatrix.center("column");
        }
      }
      const cov = xMatrix.transposeMultiply(yMatrix);
      for (let i = 0; i < cov.rows; i++) {
        for (let j = 0; j < cov.columns; j++) {
          cov.set(i, j, cov.get(i, j) * (1 / (xMatrix.rows - 1)));
        }
      }
      return cov;
    }
    function correlation2(xMatrix, yMatrix = xMatrix, options = {}) {
      xMatrix = new Matrix3(xMatrix);
      let yIsSame = false;
      if (typeof yMatrix === "object" && !Matrix3.isMatrix(yMatrix) && !isAnyArray(yMatrix)) {
        options = yMatrix;
        yMatrix = xMatrix;
        yIsSame = true;
      } else {
        yMatrix = new Matrix3(yMatrix);
      }
      if (xMatrix.rows !== yMatrix.rows) {
        throw new TypeError("Both matrices must have the same number of rows");
      }
      const { center = true, scale = true } = options;
      if (center) {
        xMatrix.center("column");
        if (!yIsSame) {
          yMatrix.center("column");
        }
      }
      if (scale) {
        xMatrix.scale("column");
        if (!yIsSame) {
          yMatrix.scale("column");
        }
      }
      const sdx = xMatrix.standardDeviation("column", { unbiased: true });
      const sdy = yIsSame ? sdx : yMatrix.standardDeviation("column", { unbiased: true });
      const corr = xMatrix.transposeMultiply(yMatrix);
      for (let i = 0; i < corr.rows; i++) {
        for (let j = 0; j < corr.columns; j++) {
          corr.set(
            i,
            j,
            corr.get(i, j) * (1 / (sdx[i] * sdy[j])) * (1 / (xMatrix.rows - 1))
          );
        }
      }
      return corr;
    }
    var EigenvalueDecomposition3 = class {
      constructor(matrix2, options = {}) {
        const { assumeSymmetric = false } = options;
        matrix2 = WrapperMatrix2D2.checkMatrix(matrix2);
        if (!matrix2.isSquare()) {
          throw new Error("Matrix is not a square matrix");
        }
        if (matrix2.isEmpty()) {
          throw new Error("Matrix must be non-empty");
        }
        let n2 = matrix2.columns;
        let V = new Matrix3(n2, n2);
        let d = new Float64Array(n2);
        let e = new Float64Array(n2);
        let value = matrix2;
        let i, j;
        let isSymmetric = false;
        if (assumeSymmetric) {
          isSymmetric = true;
        } else {
          isSymmetric = matrix2.isSymmetric();
        }
        if (isSymmetric) {
          for (i = 0; i < n2; i++) {
            for (j = 0; j < n2; j++) {
              V.set(j, i, value.get(i, j));
            }
          }
          tred2(n2, e, d, V);
          tql2(n2, e, d, V);
          transposeSquareInPlace(V);
        } else {
          let H = new Matrix3(n2, n2);
          let ort = new Float64Array(n2);
          for (j = 0; j < n2; j++) {
            for (i = 0; i < n2; i++) {
              H.set(i, j, value.get(i, j));
            }
          }
          orthes(n2, H, ort, V);
          hqr2(n2, e, d, V, H);
        }
        this.n = n2;
        this.e = e;
        this.d = d;
        this.V = V;
      }
      get realEigenvalues() {
        return Array.from(this.d);
      }
      get imaginaryEigenvalues() {
        return Array.from(this.e);
      }
      get eigenvectorMatrix() {
        return this.V;
      }
      get diagonalMatrix() {
        let n2 = this.n;
        let e = this.e;
        let d = this.d;
        let X = new Matrix3(n2, n2);
        let i, j;
        for (i = 0; i < n2; i++) {
          for (j = 0; j < n2; j++) {
            X.set(i, j, 0);
          }
          X.set(i, i, d[i]);
          if (e[i] > 0) {
            X.set(i, i + 1, e[i]);
          } else if (e[i] < 0) {
            X.set(i, i - 1, e[i]);
          }
        }
        return X;
      }
    };
    function tred2(n2, e, d, V) {
      let f, g, h, i, j, k, hh, scale;
      for (j = 0; j < n2; j++) {
        d[j] = V.get(j, n2 - 1);
      }
      for (i = n2 - 1; i > 0; i--) {
        scale = 0;
        h = 0;
        for (k = 0; k < i; k++) {
          scale = scale + Math.abs(d[k]);
        }
        if (scale === 0) {
          e[i] = d[i - 1];
          for (j = 0; j < i; j++) {
            d[j] = V.get(j, i - 1);
            V.set(j, i, 0);
            V.set(i, j, 0);
          }
        } else {
          for (k = 0; k < i; k++) {
            d[k] /= scale;
            h += d[k] * d[k];
          }
          f = d[i - 1];
          g = Math.sqrt(h);
          if (f > 0) {
            g = -g;
          }
          e[i] = scale * g;
          h = h - f * g;
          d[i - 1] = f - g;
          for (j = 0; j < i; j++) {
            e[j] = 0;
          }
          for (j = 0; j < i; j++) {
            f = d[j];
            V.set(i, j, f);
            g = e[j] + V.get(j, j) * f;
            for (k = j + 1; k <= i - 1; k++) {
              g += V.get(j, k) * d[k];
              e[k] += V.get(j, k) * f;
            }
            e[j] = g;
          }
          f = 0;
          for (j = 0; j < i; j++) {
            e[j] /= h;
            f += e[j] * d[j];
          }
          hh = f / (h + h);
          for (j = 0; j < i; j++) {
            e[j] -= hh * d[j];
          }
          for (j = 0; j < i; j++) {
            f = d[j];
            g = e[j];
            for (k = j; k <= i - 1; k++) {
              V.set(j, k, V.get(j, k) - (f * e[k] + g * d[k]));
            }
            d[j] = V.get(j, i - 1);
            V.set(j, i, 0);
          }
        }
        d[i] = h;
      }
      for (i = 0; i < n2 - 1; i++) {
        V.set(i, n2 - 1, V.get(i, i));
        V.set(i, i, 1);
        h = d[i + 1];
        if (h !== 0) {
          for (k = 0; k <= i; k++) {
            d[k] = V.get(i + 1, k) / h;
          }
          for (j = 0; j <= i; j++) {
            g = 0;
            for (k = 0; k <= i; k++) {
              g += V.get(i + 1, k) * V.get(j, k);
            }
            for (k = 0; k <= i; k++) {
              V.set(j, k, V.get(j, k) - g * d[k]);
            }
          }
        }
        for (k = 0; k <= i; k++) {
          V.set(i + 1, k, 0);
        }
      }
      for (j = 0; j < n2; j++) {
        d[j] = V.get(j, n2 - 1);
        V.set(j, n2 - 1, 0);
      }
      V.set(n2 - 1, n2 - 1, 1);
      e[0] = 0;
    }
    function tql2(n2, e, d, V) {
      let g, h, i, j, k, l, m, p, r, dl1, c, c2, c3, el1, s, s2;
      for (i = 1; i < n2; i++) {
        e[i - 1] = e[i];
      }
      e[n2 - 1] = 0;
      let f = 0;
      let tst1 = 0;
      let eps = Number.EPSILON;
      for (l = 0; l < n2; l++) {
        tst1 = Math.max(tst1, Math.abs(d[l]) + Math.abs(e[l]));
        m = l;
        while (m < n2) {
          if (Math.abs(e[m]) <= eps * tst1) {
            break;
          }
          m++;
        }
        if (m > l) {
          do {
            g = d[l];
            p = (d[l + 1] - g) / (2 * e[l]);
            r = hypotenuse(p, 1);
            if (p < 0) {
              r = -r;
            }
            d[l] = e[l] / (p + r);
            d[l + 1] = e[l] * (p + r);
            dl1 = d[l + 1];
            h = g - d[l];
            for (i = l + 2; i < n2; i++) {
              d[i] -= h;
            }
            f = f + h;
            p = d[m];
            c = 1;
            c2 = c;
            c3 = c;
            el1 = e[l + 1];
            s = 0;
            s2 = 0;
            for (i = m - 1; i >= l; i--) {
              c3 = c2;
              c2 = c;
              s2 = s;
              g = c * e[i];
              h = c * p;
              r = hypotenuse(p, e[i]);
              e[i + 1] = s * r;
              s = e[i] / r;
              c = p / r;
              p = c * d[i] - s * g;
              d[i + 1] = h + s * (c * g + s * d[i]);
              for (k = 0; k < n2; k++) {
                h = V.get(i + 1, k);
                V.set(i + 1, k, s * V.get(i, k) + c * h);
                V.set(i, k, c * V.get(i, k) - s * h);
              }
            }
            p = -s * s2 * c3 * el1 * e[l] / dl1;
            e[l] = s * p;
            d[l] = c * p;
          } while (Math.abs(e[l]) > eps * tst1);
        }
        d[l] = d[l] + f;
        e[l] = 0;
      }
      for (i = 0; i < n2 - 1; i++) {
        k = i;
        p = d[i];
        for (j = i + 1; j < n2; j++) {
          if (d[j] < p) {
            k = j;
            p = d[j];
          }
        }
        if (k !== i) {
          d[k] = d[i];
          d[i] = p;
          for (j = 0; j < n2; j++) {
            p = V.get(i, j);
            V.set(i, j, V.get(k, j));
            V.set(k, j, p);
          }
        }
      }
    }
    function orthes(n2, H, ort, V) {
      let low = 0;
      let high = n2 - 1;
      let f, g, h, i, j, m;
      let scale;
      for (m = low + 1; m <= high - 1; m++) {
        scale = 0;
        for (i = m; i <= high; i++) {
          scale = scale + Math.abs(H.get(i, m - 1));
        }
        if (scale !== 0) {
          h = 0;
          for (i = high; i >= m; i--) {
            ort[i] = H.get(i, m - 1) / scale;
            h += ort[i] * ort[i];
          }
          g = Math.sqrt(h);
          if (ort[m] > 0) {
            g = -g;
          }
          h = h - ort[m] * g;
          ort[m] = ort[m] - g;
          for (j = m; j < n2; j++) {
            f = 0;
            for (i = high; i >= m; i--) {
              f += ort[i] * H.get(i, j);
            }
            f = f / h;
            for (i = m; i <= high; i++) {
              H.set(i, j, H.get(i, j) - f * ort[i]);
            }
          }
          for (i = 0; i <= high; i++) {
            f = 0;
            for (j = high; j >= m; j--) {
              f += ort[j] * H.get(i, j);
            }
            f = f / h;
            for (j = m; j <= high; j++) {
              H.set(i, j, H.get(i, j) - f * ort[j]);
            }
          }
          ort[m] = scale * ort[m];
          H.set(m, m - 1, scale * g);
        }
      }
      for (i = 0; i < n2; i++) {
        for (j = 0; j < n2; j++) {
          V.set(i, j, i === j ? 1 : 0);
        }
      }
      for (m = high - 1; m >= low + 1; m--) {
        if (H.get(m, m - 1) !== 0) {
          for (i = m + 1; i <= high; i++) {
            ort[i] = H.get(i, m - 1);
          }
          for (j = m; j <= high; j++) {
            g = 0;
            for (i = m; i <= high; i++) {
              g += ort[i] * V.get(i, j);
            }
            g = g / ort[m] / H.get(m, m - 1);
            for (i = m; i <= high; i++) {
              V.set(i, j, V.get(i, j) + g * ort[i]);
            }
          }
        }
      }
    }
    function hqr2(nn, e, d, V, H) {
      let n2 = nn - 1;
      let low = 0;
      let high = nn - 1;
      let eps = Number.EPSILON;
      let exshift = 0;
      let norm = 0;
      let p = 0;
      let q = 0;
      let r = 0;
      let s = 0;
      let z = 0;
      let iter = 0;
      let i, j, k, l, m, t, w, x, y;
      let ra, sa, vr, vi;
      let notlast, cdivres;
      for (i = 0; i < nn; i++) {
        if (i < low || i > high) {
          d[i] = H.get(i, i);
          e[i] = 0;
        }
        for (j = Math.max(i - 1, 0); j < nn; j++) {
          norm = norm + Math.abs(H.get(i, j));
        }
      }
      while (n2 >= low) {
        l = n2;
        while (l > low) {
          s = Math.abs(H.get(l - 1, l - 1)) + Math.abs(H.get(l, l));
          if (s === 0) {
            s = norm;
          }
          if (Math.abs(H.get(l, l - 1)) < eps * s) {
            break;
          }
          l--;
        }
        if (l === n2) {
          H.set(n2, n2, H.get(n2, n2) + exshift);
          d[n2] = H.get(n2, n2);
          e[n2] = 0;
          n2--;
          iter = 0;
        } else if (l === n2 - 1) {
          w = H.get(n2, n2 - 1) * H.get(n2 - 1, n2);
          p = (H.get(n2 - 1, n2 - 1) - H.get(n2, n2)) / 2;
          q = p * p + w;
          z = Math.sqrt(Math.abs(q));
          H.set(n2, n2, H.get(n2, n2) + exshift);
          H.set(n2 - 1, n2 - 1, H.get(n2 - 1, n2 - 1) + exshift);
          x = H.get(n2, n2);
          if (q >= 0) {
            z = p >= 0 ? p + z : p - z;
            d[n2 - 1] = x + z;
            d[n2] = d[n2 - 1];
            if (z !== 0) {
              d[n2] = x - w / z;
            }
            e[n2 - 1] = 0;
            e[n2] = 0;
            x = H.get(n2, n2 - 1);
            s = Math.abs(x) + Math.abs(z);
            p = x / s;
            q = z / s;
            r = Math.sqrt(p * p + q * q);
            p = p / r;
            q = q / r;
            for (j = n2 - 1; j < nn; j++) {
              z = H.get(n2 - 1, j);
              H.set(n2 - 1, j, q * z + p * H.get(n2, j));
              H.set(n2, j, q * H.get(n2, j) - p * z);
            }
            for (i = 0; i <= n2; i++) {
              z = H.get(i, n2 - 1);
              H.set(i, n2 - 1, q * z + p * H.get(i, n2));
              H.set(i, n2, q * H.get(i, n2) - p * z);
            }
            for (i = low; i <= high; i++) {
              z = V.get(i, n2 - 1);
              V.set(i, n2 - 1, q * z + p * V.get(i, n2));
              V.set(i, n2, q * V.get(i, n2) - p * z);
            }
          } else {
            d[n2 - 1] = x + p;
            d[n2] = x + p;
            e[n2 - 1] = z;
            e[n2] = -z;
          }
          n2 = n2 - 2;
          iter = 0;
        } else {
          x = H.get(n2, n2);
          y = 0;
          w = 0;
          if (l < n2) {
            y = H.get(n2 - 1, n2 - 1);
            w = H.get(n2, n2 - 1) * H.get(n2 - 1, n2);
          }
          if (iter === 10) {
            exshift += x;
            for (i = low; i <= n2; i++) {
              H.set(i, i, H.get(i, i) - x);
            }
            s = Math.abs(H.get(n2, n2 - 1)) + Math.abs(H.get(n2 - 1, n2 - 2));
            x = y = 0.75 * s;
            w = -0.4375 * s * s;
          }
          if (iter === 30) {
            s = (y - x) / 2;
            s = s * s + w;
            if (s > 0) {
              s = Math.sqrt(s);
              if (y < x) {
                s = -s;
              }
              s = x - w / ((y - x) / 2 + s);
              for (i = low; i <= n2; i++) {
                H.set(i, i, H.get(i, i) - s);
              }
              exshift += s;
              x = y = w = 0.964;
            }
          }
          iter = iter + 1;
          m = n2 - 2;
          while (m >= l) {
            z = H.get(m, m);
            r = x - z;
            s = y - z;
            p = (r * s - w) / H.get(m + 1, m) + H.get(m, m + 1);
            q = H.get(m + 1, m + 1) - z - r - s;
            r = H.get(m + 2, m + 1);
            s = Math.abs(p) + Math.abs(q) + Math.abs(r);
            p = p / s;
            q = q / s;
            r = r / s;
            if (m === l) {
              break;
            }
            if (Math.abs(H.get(m, m - 1)) * (Math.abs(q) + Math.abs(r)) < eps * (Math.abs(p) * (Math.abs(H.get(m - 1, m - 1)) + Math.abs(z) + Math.abs(H.get(m + 1, m + 1))))) {
              break;
            }
            m--;
          }
          for (i = m + 2; i <= n2; i++) {
            H.set(i, i - 2, 0);
            if (i > m + 2) {
              H.set(i, i - 3, 0);
            }
          }
          for (k = m; k <= n2 - 1; k++) {
            notlast = k !== n2 - 1;
            if (k !== m) {
              p = H.get(k, k - 1);
              q = H.get(k + 1, k - 1);
              r = notlast ? H.get(k + 2, k - 1) : 0;
              x = Math.abs(p) + Math.abs(q) + Math.abs(r);
              if (x !== 0) {
                p = p / x;
                q = q / x;
                r = r / x;
              }
            }
            if (x === 0) {
              break;
            }
            s = Math.sqrt(p * p + q * q + r * r);
            if (p < 0) {
              s = -s;
            }
            if (s !== 0) {
              if (k !== m) {
                H.set(k, k - 1, -s * x);
              } else if (l !== m) {
                H.set(k, k - 1, -H.get(k, k - 1));
              }
              p = p + s;
              x = p / s;
              y = q / s;
              z = r / s;
              q = q / p;
              r = r / p;
              for (j = k; j < nn; j++) {
                p = H.get(k, j) + q * H.get(k + 1, j);
                if (notlast) {
                  p = p + r * H.get(k + 2, j);
                  H.set(k + 2, j, H.get(k + 2, j) - p * z);
                }
                H.set(k, j, H.get(k, j) - p * x);
                H.set(k + 1, j, H.get(k + 1, j) - p * y);
              }
              for (i = 0; i <= Math.min(n2, k + 3); i++) {
                p = x * H.get(i, k) + y * H.get(i, k + 1);
                if (notlast) {
                  p = p + z * H.get(i, k + 2);
                  H.set(i, k + 2, H.get(i, k + 2) - p * r);
                }
                H.set(i, k, H.get(i, k) - p);
                H.set(i, k + 1, H.get(i, k + 1) - p * q);
              }
              for (i = low; i <= high; i++) {
                p = x * V.get(i, k) + y * V.get(i, k + 1);
                if (notlast) {
                  p = p + z * V.get(i, k + 2);
                  V.set(i, k + 2, V.get(i, k + 2) - p * r);
                }
                V.set(i, k, V.get(i, k) - p);
                V.set(i, k + 1, V.get(i, k + 1) - p * q);
              }
            }
          }
        }
      }
      if (norm === 0) {
        return;
      }
      for (n2 = nn - 1; n2 >= 0; n2--) {
        p = d[n2];
        q = e[n2];
        if (q === 0) {
          l = n2;
          H.set(n2, n2, 1);
          for (i = n2 - 1; i >= 0; i--) {
            w = H.get(i, i) - p;
            r = 0;
            for (j = l; j <= n2; j++) {
              r = r + H.get(i, j) * H.get(j, n2);
            }
            if (e[i] < 0) {
              z = w;
              s = r;
            } else {
              l = i;
              if (e[i] === 0) {
                H.set(i, n2, w !== 0 ? -r / w : -r / (eps * norm));
              } else {
                x = H.get(i, i + 1);
                y = H.get(i + 1, i);
                q = (d[i] - p) * (d[i] - p) + e[i] * e[i];
                t = (x * s - z * r) / q;
                H.set(i, n2, t);
                H.set(
                  i + 1,
                  n2,
                  Math.abs(x) > Math.abs(z) ? (-r - w * t) / x : (-s - y * t) / z
                );
              }
              t = Math.abs(H.get(i, n2));
              if (eps * t * t > 1) {
                for (j = i; j <= n2; j++) {
                  H.set(j, n2, H.get(j, n2) / t);
                }
              }
            }
          }
        } else if (q < 0) {
          l = n2 - 1;
          if (Math.abs(H.get(n2, n2 - 1)) > Math.abs(H.get(n2 - 1, n2))) {
            H.set(n2 - 1, n2 - 1, q / H.get(n2, n2 - 1));
            H.set(n2 - 1, n2, -(H.get(n2, n2) - p) / H.get(n2, n2 - 1));
          } else {
            cdivres = cdiv(0, -H.get(n2 - 1, n2), H.get(n2 - 1, n2 - 1) - p, q);
            H.set(n2 - 1, n2 - 1, cdivres[0]);
            H.set(n2 - 1, n2, cdivres[1]);
          }
          H.set(n2, n2 - 1, 0);
          H.set(n2, n2, 1);
          for (i = n2 - 2; i >= 0; i--) {
            ra = 0;
            sa = 0;
            for (j = l; j <= n2; j++) {
              ra = ra + H.get(i, j) * H.get(j, n2 - 1);
              sa = sa + H.get(i, j) * H.get(j, n2);
            }
            w = H.get(i, i) - p;
            if (e[i] < 0) {
              z = w;
              r = ra;
              s = sa;
            } else {
              l = i;
              if (e[i] === 0) {
                cdivres = cdiv(-ra, -sa, w, q);
                H.set(i, n2 - 1, cdivres[0]);
                H.set(i, n2, cdivres[1]);
              } else {
                x = H.get(i, i + 1);
                y = H.get(i + 1, i);
                vr = (d[i] - p) * (d[i] - p) + e[i] * e[i] - q * q;
                vi = (d[i] - p) * 2 * q;
                if (vr === 0 && vi === 0) {
                  vr = eps * norm * (Math.abs(w) + Math.abs(q) + Math.abs(x) + Math.abs(y) + Math.abs(z));
                }
                cdivres = cdiv(
                  x * r - z * ra + q * sa,
                  x * s - z * sa - q * ra,
                  vr,
                  vi
                );
                H.set(i, n2 - 1, cdivres[0]);
                H.set(i, n2, cdivres[1]);
                if (Math.abs(x) > Math.abs(z) + Math.abs(q)) {
                  H.set(
                    i + 1,
                    n2 - 1,
                    (-ra - w * H.get(i, n2 - 1) + q * H.get(i, n2)) / x
                  );
                  H.set(
                    i + 1,
                    n2,
                    (-sa - w * H.get(i, n2) - q * H.get(i, n2 - 1)) / x
                  );
                } else {
                  cdivres = cdiv(
                    -r - y * H.get(i, n2 - 1),
                    -s - y * H.get(i, n2),
                    z,
                    q
                  );
                  H.set(i + 1, n2 - 1, cdivres[0]);
                  H.set(i + 1, n2, cdivres[1]);
                }
              }
              t = Math.max(Math.abs(H.get(i, n2 - 1)), Math.abs(H.get(i, n2)));
              if (eps * t * t > 1) {
                for (j = i; j <= n2; j++) {
                  H.set(j, n2 - 1, H.get(j, n2 - 1) / t);
                  H.set(j, n2, H.get(j, n2) / t);
                }
              }
            }
          }
        }
      }
      for (i = 0; i < nn; i++) {
        if (i < low || i > high) {
          for (j = i; j < nn; j++) {
            V.set(i, j, H.get(i, j));
          }
        }
      }
      for (j = nn - 1; j >= low; j--) {
        for (i = low; i <= high; i++) {
          z = 0;
          for (k = low; k <= Math.min(j, high); k++) {
            z = z + V.get(i, k) * H.get(k, j);
          }
          V.set(i, j, z);
        }
      }
    }
    function cdiv(xr, xi, yr, yi) {
      let r, d;
      if (Math.abs(yr) > Math.abs(yi)) {
        r = yi / yr;
        d = yr + r * yi;
        return [(xr + r * xi) / d, (xi - r * xr) / d];
      } else {
        r = yr / yi;
        d = yi + r * yr;
        return [(r * xr + xi) / d, (r * xi - xr) / d];
      }
    }
    var CholeskyDecomposition2 = class {
      constructor(value) {
        value = WrapperMatrix2D2.checkMatrix(value);
        if (!value.isSymmetric()) {
          throw new Error("Matrix is not symmetric");
        }
        let a = value;
        let dimension = a.rows;
        let l = new Matrix3(dimension, dimension);
        let positiveDefinite = true;
        let i, j, k;
        for (j = 0; j < dimension; j++) {
          let d = 0;
          for (k = 0; k < j; k++) {
            let s = 0;
            for (i = 0; i < k; i++) {
              s += l.get(k, i) * l.get(j, i);
            }
            s = (a.get(j, k) - s) / l.get(k, k);
            l.set(j, k, s);
            d = d + s * s;
          }
          d = a.get(j, j) - d;
          positiveDefinite &&= d > 0;
          l.set(j, j, Math.sqrt(Math.max(d, 0)));
          for (k = j + 1; k < dimension; k++) {
            l.set(j, k, 0);
          }
        }
        this.L = l;
        this.positiveDefinite = positiveDefinite;
      }
      isPositiveDefinite() {
        return this.positiveDefinite;
      }
      solve(value) {
        value = WrapperMatrix2D2.checkMatrix(value);
        let l = this.L;
        let dimension = l.rows;
        if (value.rows !== dimension) {
          throw new Error("Matrix dimensions do not match");
        }
        if (this.isPositiveDefinite() === false) {
          throw new Error("Matrix is not positive definite");
        }
        let count = value.columns;
        let B = value.clone();
        let i, j, k;
        for (k = 0; k < dimension; k++) {
          for (j = 0; j < count; j++) {
            for (i = 0; i < k; i++) {
              B.set(k, j, B.get(k, j) - B.get(i, j) * l.get(k, i));
            }
            B.set(k, j, B.get(k, j) / l.get(k, k));
          }
        }
        for (k = dimension - 1; k >= 0; k--) {
          for (j = 0; j < count; j++) {
            for (i = k + 1; i < dimension; i++) {
              B.set(k, j, B.get(k, j) - B.get(i, j) * l.get(i, k));
            }
            B.set(k, j, B.get(k, j) / l.get(k, k));
          }
        }
        return B;
      }
      get lowerTriangularMatrix() {
        return this.L;
      }
    };
    var nipals = class {
      constructor(X, options = {}) {
        X = WrapperMatrix2D2.checkMatrix(X);
        let { Y } = options;
        const {
          scaleScores = false,
          maxIterations = 1e3,
          terminationCriteria = 1e-10
        } = options;
        let u;
        if (Y) {
          if (isAnyArray(Y) && typeof Y[0] === "number") {
            Y = Matrix3.columnVector(Y);
          } else {
            Y = WrapperMatrix2D2.checkMatrix(Y);
          }
          if (Y.rows !== X.rows) {
            throw new Error("Y should have the same number of rows as X");
          }
          u = Y.getColumnVector(0);
        } else {
          u = X.getColumnVector(0);
        }
        let diff = 1;
        let t, q, w, tOld;
        for (let counter = 0; counter < maxIterations && diff > terminationCriteria; counter++) {
          w = X.transpose().mmul(u).div(u.transpose().mmul(u).get(0, 0));
          w = w.div(w.norm());
          t = X.mmul(w).div(w.transpose().mmul(w).get(0, 0));
          if (counter > 0) {
            diff = t.clone().sub(tOld).pow(2).sum();
          }
          tOld = t.clone();
          if (Y) {
            q = Y.transpose().mmul(t).div(t.transpose().mmul(t).get(0, 0));
            q = q.div(q.norm());
            u = Y.mmul(q).div(q.transpose().mmul(q).get(0, 0));
          } else {
            u = t;
          }
        }
        if (Y) {
          let p = X.transpose().mmul(t).div(t.transpose().mmul(t).get(0, 0));
          p = p.div(p.norm());
          let xResidual = X.clone().sub(t.clone().mmul(p.transpose()));
          let residual = u.transpose().mmul(t).div(t.transpose().mmul(t).get(0, 0));
          let yResidual = Y.clone().sub(
            t.clone().mulS(residual.get(0, 0)).mmul(q.transpose())
          );
          this.t = t;
          this.p = p.transpose();
          this.w = w.transpose();
          this.q = q;
          this.u = u;
          this.s = t.transpose().mmul(t);
          this.xResidual = xResidual;
          this.yResidual = yResidual;
          this.betas = residual;
        } else {
          this.w = w.transpose();
          this.s = t.transpose().mmul(t).sqrt();
          if (scaleScores) {
            this.t = t.clone().div(this.s.get(0, 0));
          } else {
            this.t = t;
          }
          this.xResidual = X.sub(t.mmul(w.transpose()));
        }
      }
    };
    exports.AbstractMatrix = AbstractMatrix2;
    exports.CHO = CholeskyDecomposition2;
    exports.CholeskyDecomposition = CholeskyDecomposition2;
    exports.DistanceMatrix = DistanceMatrix2;
    exports.EVD = EigenvalueDecomposition3;
    exports.EigenvalueDecomposition = EigenvalueDecomposition3;
    exports.LU = LuDecomposition2;
    exports.LuDecomposition = LuDecomposition2;
    exports.Matrix = Matrix3;
    exports.MatrixColumnSelectionView = MatrixColumnSelectionView2;
    exports.MatrixColumnView = MatrixColumnView2;
    exports.MatrixFlipColumnView = MatrixFlipColumnView2;
    exports.MatrixFlipRowView = MatrixFlipRowView2;
    exports.MatrixRowSelectionView = MatrixRowSelectionView2;
    exports.MatrixRowView = MatrixRowView2;
    exports.MatrixSelectionView = MatrixSelectionView2;
    exports.MatrixSubView = MatrixSubView2;
    exports.MatrixTransposeView = MatrixTransposeView2;
    exports.NIPALS = nipals;
    exports.Nipals = nipals;
    exports.QR = QrDecomposition2;
    exports.QrDecomposition = QrDecomposition2;
    exports.SVD = SingularValueDecomposition2;
    exports.SingularValueDecomposition = SingularValueDecomposition2;
    exports.SymmetricMatrix = SymmetricMatrix2;
    exports.WrapperMatrix1D = WrapperMatrix1D2;
    exports.WrapperMatrix2D = WrapperMatrix2D2;
    exports.correlation = correlation2;
    exports.covariance = covariance2;
    exports.default = Matrix3;
    exports.determinant = determinant2;
    exports.inverse = inverse2;
    exports.linearDependencies = linearDependencies2;
    exports.pseudoInverse = pseudoInverse2;
    exports.solve = solve2;
    exports.wrap = wrap2;
  }
});

// ../../../tmp/i15/evalCode.ts
import { readFileSync as readFileSync3 } from "node:fs";

// test/helpers/rankingChecks.ts
import { existsSync as existsSync2, readFileSync as readFileSync2 } from "node:fs";
import { join as join2 } from "node:path";
import { gunzipSync } from "node:zlib";

// src/core/errors.ts
var UndertoneError = class extends Error {
  constructor(message) {
    super(message);
    this.name = new.target.name;
  }
};
var InvalidInputError = class extends UndertoneError {
};
var EmptyCorpusError = class extends UndertoneError {
};
var NoKnownTermsError = class extends UndertoneError {
  constructor(query) {
    super(`None of the words in "${truncate(query, 60)}" occur in the index, so there is nothing to rank by.`);
    this.query = query;
  }
  query;
};
var NotIndexedError = class extends UndertoneError {
  constructor(key) {
    super(`"${key}" is not in the index (excluded, binary, too large, or not indexed yet).`);
    this.key = key;
  }
  key;
};
var CancelledError = class extends UndertoneError {
  constructor() {
    super("Cancelled.");
  }
};
function truncate(s, n2) {
  return s.length <= n2 ? s : `${s.slice(0, n2 - 1)}\u2026`;
}

// src/core/text/tokenize.ts
import PorterStemmer from "natural/lib/natural/stemmers/porter_stemmer.js";

// src/core/text/stopWords.ts
import { words as englishStopWords } from "natural/lib/natural/util/stopwords.js";
var PROGRAMMING_KEYWORDS = `
abstract and as assert async await auto bool boolean break byte case catch char class const constructor
continue def default defer del delete do double elif else enum export extends extern false final finally
float fn for from func function get go goto if impl implements import in instanceof int interface is let
long match mod module mut namespace new nil none not null object of or package pass private protected pub
public raise readonly ref return self set short signed static str string struct super switch this throw
throws trait true try type typedef typeof uint undefined union unsigned use using var void volatile where
while with yield
args arg argv len val tmp obj ptr err ctx cfg opts idx num ret res req src dst buf str
`;
var EXTRA_ENGLISH = `also may might must shall will would could should can cannot i.e e.g etc us we our ours you your
yours he him his she her hers it its they them their theirs what which who whom whose this that these those`;
var STOP_WORDS = new Set(
  [...englishStopWords, ...PROGRAMMING_KEYWORDS.split(/\s+/), ...EXTRA_ENGLISH.split(/\s+/)].filter((w) => w.length > 0)
);

// src/core/text/tokenRules.ts
var MAX_TOKEN_LENGTH = 40;
var MAX_DIGIT_RUN = 4;
var MIN_HEXISH_LENGTH = 8;

// src/core/text/tokenize.ts
var DEFAULT_TOKENIZE_OPTIONS = Object.freeze({ stem: true, keepCompounds: true });
var WORD = /[\p{L}\p{N}_$]+/gu;
var MARKS = /\p{M}+/gu;
var CAMEL = /(?<=\p{Ll})(?=\p{Lu})|(?<=\p{Lu})(?=\p{Lu}\p{Ll})|(?<=\p{L})(?=\p{N})|(?<=\p{N})(?=\p{L})/u;
var LONG_DIGITS = new RegExp(`^\\p{N}{${MAX_DIGIT_RUN + 1},}$`, "u");
var HEXISH = new RegExp(`^(?=.*\\d)[0-9a-f]{${MIN_HEXISH_LENGTH},}$`);
var HEX_LITERAL = /^0[xX][0-9a-fA-F]+$/;
var STEM_CACHE_LIMIT = 5e5;
var stemCache = /* @__PURE__ */ new Map();
function stemWord(word) {
  let s = stemCache.get(word);
  if (s === void 0) {
    s = PorterStemmer.stem(word);
    if (stemCache.size >= STEM_CACHE_LIMIT) stemCache.clear();
    stemCache.set(word, s);
  }
  return s;
}
function keep(token) {
  return token.length > 1 && token.length <= MAX_TOKEN_LENGTH && !STOP_WORDS.has(token) && !LONG_DIGITS.test(token) && !HEXISH.test(token);
}
function splitIdentifier(word) {
  const parts = [];
  for (const piece of word.split(/[_$]+/)) {
    if (piece.length === 0) continue;
    for (const p of piece.split(CAMEL)) if (p.length > 0) parts.push(p);
  }
  return parts;
}
function tokenize(text, options = {}) {
  const opts = { ...DEFAULT_TOKENIZE_OPTIONS, ...options };
  const out = [];
  const normalised = text.normalize("NFKD").replace(MARKS, "");
  const emit = (raw) => {
    const t = raw.toLowerCase();
    if (!keep(t)) return;
    out.push(opts.stem ? stemWord(t) : t);
  };
  for (const m of normalised.matchAll(WORD)) {
    const word = m[0];
    if (HEX_LITERAL.test(word) || HEXISH.test(word.toLowerCase())) continue;
    const parts = splitIdentifier(word);
    if (parts.length === 1 && parts[0] === word) {
      emit(word);
      continue;
    }
    for (const p of parts) emit(p);
    if (opts.keepCompounds && parts.length > 1) {
      const compound = parts.join("");
      if (compound.length <= MAX_TOKEN_LENGTH && !/^\p{N}+$/u.test(compound)) emit(compound);
    }
  }
  return out;
}

// src/core/random.ts
var DEFAULT_SEED = 20261201;
function createRandom(seed = DEFAULT_SEED) {
  let x = seed >>> 0;
  const split = () => {
    x = x + 2654435769 >>> 0;
    let z = x;
    z = Math.imul(z ^ z >>> 16, 2246822507) >>> 0;
    z = Math.imul(z ^ z >>> 13, 3266489909) >>> 0;
    return (z ^ z >>> 16) >>> 0;
  };
  let s0 = split();
  let s1 = split();
  let s2 = split();
  let s3 = split();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  const nextUint32 = () => {
    const r = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return r;
  };
  const next = () => nextUint32() / 4294967296;
  let spare = null;
  const normal = () => {
    if (spare !== null) {
      const v = spare;
      spare = null;
      return v;
    }
    let u = 0;
    while (u === 0) u = next();
    const w = next();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * w);
    return r * Math.cos(2 * Math.PI * w);
  };
  return { next, normal, nextUint32 };
}
function rotl(v, k) {
  return (v << k | v >>> 32 - k) >>> 0;
}

// src/core/matrix/kernels.ts
var GAUSSIAN_BLOCK_ROWS = 2048;
function gaussianBlock(out, rows, l, seed, b, random) {
  const r = random(Math.imul(seed ^ 1540483477, 2654435761) + Math.imul(b + 1, 2246822507) >>> 0);
  const end = Math.min(rows, (b + 1) * GAUSSIAN_BLOCK_ROWS) * l;
  const scale = 2 / 4294967296;
  let i = b * GAUSSIAN_BLOCK_ROWS * l;
  while (i < end) {
    const x = r.nextUint32() * scale - 1;
    const y = r.nextUint32() * scale - 1;
    const s = x * x + y * y;
    if (s >= 1 || s === 0) continue;
    const f = Math.sqrt(-2 * Math.log(s) / s);
    out[i++] = x * f;
    if (i < end) out[i++] = y * f;
  }
}
function spmmRows(indptr, indices, values, x, l, y, r0, r1, grouped = true) {
  for (let i = r0; i < r1; i++) {
    const yo = i * l;
    const yEnd = yo + l;
    for (let c = yo; c < yEnd; c++) y[c] = 0;
    const p1 = indptr[i + 1];
    let p = indptr[i];
    for (; grouped && p + 4 <= p1; p += 4) {
      const v0 = values[p], v1 = values[p + 1], v2 = values[p + 2], v3 = values[p + 3];
      const x0 = indices[p] * l - yo, x1 = indices[p + 1] * l - yo, x2 = indices[p + 2] * l - yo, x3 = indices[p + 3] * l - yo;
      for (let c = yo; c < yEnd; c++) y[c] += v0 * x[x0 + c] + v1 * x[x1 + c] + v2 * x[x2 + c] + v3 * x[x3 + c];
    }
    for (; p < p1; p++) {
      const v = values[p];
      const xo = indices[p] * l - yo;
      for (let c = yo; c < yEnd; c++) y[c] += v * x[xo + c];
    }
  }
}
function crossRows(a, b, l, r0, r1, g, symmetric) {
  g.fill(0);
  const o0 = r0 * l;
  const o1 = r1 * l;
  const l4 = l - l % 4;
  for (let p = 0; p < l; p += 4) {
    const pFull = p < l4;
    for (let q = symmetric ? p : 0; q < l; q += 4) {
      if (pFull && q < l4) {
        let g00 = 0, g01 = 0, g02 = 0, g03 = 0, g10 = 0, g11 = 0, g12 = 0, g13 = 0;
        let g20 = 0, g21 = 0, g22 = 0, g23 = 0, g30 = 0, g31 = 0, g32 = 0, g33 = 0;
        for (let o = o0; o < o1; o += l) {
          const a0 = a[o + p], a1 = a[o + p + 1], a2 = a[o + p + 2], a3 = a[o + p + 3];
          const b0 = b[o + q], b1 = b[o + q + 1], b2 = b[o + q + 2], b3 = b[o + q + 3];
          g00 += a0 * b0;
          g01 += a0 * b1;
          g02 += a0 * b2;
          g03 += a0 * b3;
          g10 += a1 * b0;
          g11 += a1 * b1;
          g12 += a1 * b2;
          g13 += a1 * b3;
          g20 += a2 * b0;
          g21 += a2 * b1;
          g22 += a2 * b2;
          g23 += a2 * b3;
          g30 += a3 * b0;
          g31 += a3 * b1;
          g32 += a3 * b2;
          g33 += a3 * b3;
        }
        let t = p * l + q;
        g[t] = g00;
        g[t + 1] = g01;
        g[t + 2] = g02;
        g[t + 3] = g03;
        t += l;
        g[t] = g10;
        g[t + 1] = g11;
        g[t + 2] = g12;
        g[t + 3] = g13;
        t += l;
        g[t] = g20;
        g[t + 1] = g21;
        g[t + 2] = g22;
        g[t + 3] = g23;
        t += l;
        g[t] = g30;
        g[t + 1] = g31;
        g[t + 2] = g32;
        g[t + 3] = g33;
      } else {
        const pe = Math.min(p + 4, l);
        const qe = Math.min(q + 4, l);
        for (let pp = p; pp < pe; pp++)
          for (let qq = q; qq < qe; qq++) {
            let s = 0;
            for (let o = o0; o < o1; o += l) s += a[o + pp] * b[o + qq];
            g[pp * l + qq] = s;
          }
      }
    }
  }
}
function timesSmallRows(y, l, wt, c, upper, out, r0, r1) {
  let i = r0;
  for (; i + 4 <= r1; i += 4) {
    const y0 = i * l, y1 = y0 + l, y2 = y1 + l, y3 = y2 + l;
    const z0 = i * c, z1 = z0 + c, z2 = z1 + c, z3 = z2 + c;
    if (c % 2 === 1) {
      const b = c - 1;
      const w0 = b * l;
      const end = upper ? Math.min(b + 1, l) : l;
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
      for (let a = 0; a < end; a++) {
        const u = wt[w0 + a];
        s0 += y[y0 + a] * u;
        s1 += y[y1 + a] * u;
        s2 += y[y2 + a] * u;
        s3 += y[y3 + a] * u;
      }
      out[z0 + b] = s0;
      out[z1 + b] = s1;
      out[z2 + b] = s2;
      out[z3 + b] = s3;
    }
    for (let b = c - c % 2 - 2; b >= 0; b -= 2) {
      const w0 = b * l, w1 = w0 + l;
      const end = upper ? Math.min(b + 2, l) : l;
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0, t02 = 0, t1 = 0, t2 = 0, t3 = 0;
      for (let a = 0; a < end; a++) {
        const u = wt[w0 + a], v = wt[w1 + a];
        const x0 = y[y0 + a], x1 = y[y1 + a], x2 = y[y2 + a], x3 = y[y3 + a];
        s0 += x0 * u;
        s1 += x1 * u;
        s2 += x2 * u;
        s3 += x3 * u;
        t02 += x0 * v;
        t1 += x1 * v;
        t2 += x2 * v;
        t3 += x3 * v;
      }
      out[z0 + b] = s0;
      out[z1 + b] = s1;
      out[z2 + b] = s2;
      out[z3 + b] = s3;
      out[z0 + b + 1] = t02;
      out[z1 + b + 1] = t1;
      out[z2 + b + 1] = t2;
      out[z3 + b + 1] = t3;
    }
  }
  for (; i < r1; i++) {
    const yo = i * l;
    const zo = i * c;
    for (let b = c - 1; b >= 0; b--) {
      const w0 = b * l;
      const end = upper ? Math.min(b + 1, l) : l;
      let s = 0;
      for (let a = 0; a < end; a++) s += y[yo + a] * wt[w0 + a];
      out[zo + b] = s;
    }
  }
}

// src/core/matrix/executor.ts
var REDUCTION_BLOCK_ROWS = 1024;
function addInto(g, part) {
  for (let t = 0; t < g.length; t++) g[t] += part[t];
}
function mirrorUpper(g, l) {
  for (let p = 0; p < l; p++) for (let q = 0; q < p; q++) g[p * l + q] = g[q * l + p];
  return g;
}
function reductionBlocks(rows) {
  return Math.max(1, Math.ceil(rows / REDUCTION_BLOCK_ROWS));
}
var serialExecutor = Object.freeze({
  threads: 1,
  float64: (n2) => new Float64Array(n2),
  float32: (n2) => new Float32Array(n2),
  int32: (n2) => new Int32Array(n2),
  spmm(m, x, l, y, sequential = false) {
    spmmRows(m.indptr, m.indices, m.values, x, l, y, 0, m.rows, !sequential);
  },
  cross(a, b, rows, l) {
    const g = new Float64Array(l * l);
    const part = new Float64Array(l * l);
    for (let t = 0; t < reductionBlocks(rows); t++) {
      crossRows(a, b, l, t * REDUCTION_BLOCK_ROWS, Math.min(rows, (t + 1) * REDUCTION_BLOCK_ROWS), part, a === b);
      addInto(g, part);
    }
    return a === b ? mirrorUpper(g, l) : g;
  },
  timesSmall(y, rows, l, wt, c, upper, out) {
    timesSmallRows(y, l, wt, c, upper, out, 0, rows);
  },
  gaussian(out, rows, l, seed) {
    for (let b = 0; b * GAUSSIAN_BLOCK_ROWS < rows; b++) gaussianBlock(out, rows, l, seed, b, createRandom);
  }
});

// src/core/matrix/sparse.ts
function denseBlock(rows, cols, data) {
  const d = data ?? new Float64Array(rows * cols);
  if (d.length !== rows * cols) throw new InvalidInputError(`dense block needs ${rows * cols} numbers, got ${d.length}`);
  return { rows, cols, data: d };
}
var PLAIN_ALLOCATOR = {
  int32: (n2) => new Int32Array(n2),
  float64: (n2) => new Float64Array(n2),
  float32: (n2) => new Float32Array(n2)
};
function transposeCsr(m, alloc = PLAIN_ALLOCATOR, valueType) {
  const nnz = m.indptr[m.rows];
  const indptr = alloc.int32(m.cols + 1);
  for (let p = 0; p < nnz; p++) indptr[m.indices[p] + 1]++;
  for (let j = 0; j < m.cols; j++) indptr[j + 1] += indptr[j];
  const indices = alloc.int32(nnz);
  const f32 = valueType ? valueType === "f32" : m.values instanceof Float32Array;
  const values = f32 ? alloc.float32(nnz) : alloc.float64(nnz);
  const next = indptr.slice(0, m.cols);
  for (let i = 0; i < m.rows; i++) {
    for (let p = m.indptr[i]; p < m.indptr[i + 1]; p++) {
      const q = next[m.indices[p]]++;
      indices[q] = i;
      values[q] = m.values[p];
    }
  }
  return { rows: m.cols, cols: m.rows, indptr, indices, values };
}
function copyCsr(m, alloc, valueType) {
  const nnz = m.indptr[m.rows];
  const indptr = alloc.int32(m.rows + 1);
  indptr.set(m.indptr);
  const indices = alloc.int32(nnz);
  indices.set(m.indices.subarray(0, nnz));
  const values = valueType === "f32" ? alloc.float32(nnz) : alloc.float64(nnz);
  values.set(m.values.subarray(0, nnz));
  return { rows: m.rows, cols: m.cols, indptr, indices, values };
}

// src/core/matrix/wasm/kernelsWasm.ts
var KERNELS_WASM_BASE64 = "AGFzbQEAAAABKwRgCX9/f39/f39/fwBgBn9/f39/fwBgCH9/f39/f39/AGAHf39/f39/fwACEgEDZW52Bm1lbW9yeQIDAYCABAMIBwACAAABAwEHNgYEc3BtbQADCHNwbW1fZjMyAAIFY3Jvc3MABQV0aW1lcwABBGRvdHMABAljb2RlX2RvdHMABgr6Gwe3AQIFfwF8A0AgBiAHSARAIAAgASAGbEEDdGohCyAFIAMgBmxBA3RqIQwgA0EBayEKA0AgCCAKTARAIApBAWoiCSABIAEgCUobIAEgBBshDUQAAAAAAAAAACEOQQAhCQNAIAkgDUgEQCAOIAsgCUEDdGorAwAgAiADIAlsIApqQQN0aisDAKKgIQ4gCUEBaiEJDAELCyAMIApBA3RqIA45AwAgCkEBayEKDAELCyAGQQFqIQYMAQsLC/0EAg5/C3sgAUEDdCELIANBA3QhCiADIANBA3FrIQ0DQCAGQQRqIgggB0wEQCAAIAEgAiADIAQgBSAGIAggDRAAIAAgBiALbGoiDiALaiIPIAtqIhAgC2ohESAFIAYgCmxqIRIgDUEEayEJA0AgCUEATgRA/QwAAAAAAAAAAAAAAAAAAAAAIRb9DAAAAAAAAAAAAAAAAAAAAAAhF/0MAAAAAAAAAAAAAAAAAAAAACEY/QwAAAAAAAAAAAAAAAAAAAAAIRn9DAAAAAAAAAAAAAAAAAAAAAAhGv0MAAAAAAAAAAAAAAAAAAAAACEb/QwAAAAAAAAAAAAAAAAAAAAAIRz9DAAAAAAAAAAAAAAAAAAAAAAhHSAJQQRqIgggASABIAhKGyABIAQbIRMgAiAJQQN0aiEUQQAhCANAIAggE0gEQCAWIA4gCEEDdCIMaisDAP0UIh8gFCAIIApsaiIV/QAEACIe/fIB/fABIRYgFyAfIBX9AAQQIh/98gH98AEhFyAYIAwgD2orAwD9FCIgIB798gH98AEhGCAZICAgH/3yAf3wASEZIBogDCAQaisDAP0UIiAgHv3yAf3wASEaIBsgICAf/fIB/fABIRsgHCAMIBFqKwMA/RQiICAe/fIB/fABIRwgHSAgIB/98gH98AEhHSAIQQFqIQgMAQsLIBIgCUEDdGoiCCAW/QsEACAIIBf9CwQQIAggCmoiCCAY/QsEACAIIBn9CwQQIAggCmoiCCAa/QsEACAIIBv9CwQQIAggCmoiCCAc/QsEACAIIB39CwQQIAlBBGshCQwBCwsgBkEEaiEGDAELCyAAIAEgAiADIAQgBSAGIAdBABAAC/QEAwx/BHwEeyAEQQN0IQogBEEBdUEEdCEMA0AgBiAHSARAIAUgBiAKbGohC0EAIQQDQCAEIApJBEAgBCALakQAAAAAAAAAADkDACAEQQhqIQQMAQsLIAAgBkECdGoiBCgCACEJIAQoAgQhDQNAIAlBBGogDUxBACAIGwRAIAMgASAJQQJ0IgRqKAIAIApsaiEOIAMgASAJQQFqQQJ0Ig9qKAIAIApsaiEQIAMgASAJQQJqQQJ0IhFqKAIAIApsaiESIAMgASAJQQNqQQJ0IhNqKAIAIApsaiEUIAIgBGoqAgC7Ihf9FCEbIAIgD2oqAgC7Ihj9FCEcIAIgEWoqAgC7IhX9FCEZIAIgE2oqAgC7Ihb9FCEaQQAhBANAIAQgDEkEQCAEIAtqIg8gD/0ABAAgGyAEIA5q/QAEAP3yASAcIAQgEGr9AAQA/fIB/fABIBkgBCASav0ABAD98gH98AEgGiAEIBRq/QAEAP3yAf3wAf3wAf0LBAAgBEEQaiEEDAELCyAEIApJBEAgBCALaiIPIA8rAwAgFyAEIA5qKwMAoiAYIAQgEGorAwCioCAVIAQgEmorAwCioCAWIAQgFGorAwCioKA5AwALIAlBBGohCQwBCwsDQCAJIA1IBEAgAyABIAlBAnQiBGooAgAgCmxqIQ4gAiAEaioCALsiFf0UIRlBACEEA0AgBCAMSQRAIAQgC2oiDyAP/QAEACAZIAQgDmr9AAQA/fIB/fAB/QsEACAEQRBqIQQMAQsLIAQgCkkEQCAEIAtqIg8gDysDACAVIAQgDmorAwCioDkDAAsgCUEBaiEJDAELCyAGQQFqIQYMAQsLC/oEAwt/BHwEeyAEQQN0IQogBEEBdUEEdCEMA0AgBiAHSARAIAUgBiAKbGohC0EAIQQDQCAEIApJBEAgBCALakQAAAAAAAAAADkDACAEQQhqIQQMAQsLIAAgBkECdGoiBCgCACEJIAQoAgQhDQNAIAlBBGogDUxBACAIGwRAIAMgASAJQQJ0aigCACAKbGohDiADIAEgCUEBaiIQQQJ0aigCACAKbGohDyADIAEgCUECaiIEQQJ0aigCACAKbGohESADIAEgCUEDaiISQQJ0aigCACAKbGohEyACIAlBA3RqKwMAIhb9FCEaIAIgEEEDdGorAwAiF/0UIRsgAiAEQQN0aisDACIU/RQhGCACIBJBA3RqKwMAIhX9FCEZQQAhBANAIAQgDEkEQCAEIAtqIhAgEP0ABAAgGiAEIA5q/QAEAP3yASAbIAQgD2r9AAQA/fIB/fABIBggBCARav0ABAD98gH98AEgGSAEIBNq/QAEAP3yAf3wAf3wAf0LBAAgBEEQaiEEDAELCyAEIApJBEAgBCALaiIQIBArAwAgFiAEIA5qKwMAoiAXIAQgD2orAwCioCAUIAQgEWorAwCioCAVIAQgE2orAwCioKA5AwALIAlBBGohCQwBCwsDQCAJIA1IBEAgAyABIAlBAnRqKAIAIApsaiEOIAIgCUEDdGorAwAiFP0UIRhBACEEA0AgBCAMSQRAIAQgC2oiDyAP/QAEACAYIAQgDmr9AAQA/fIB/fAB/QsEACAEQRBqIQQMAQsLIAQgCkkEQCAEIAtqIg8gDysDACAUIAQgDmorAwCioDkDAAsgCUEBaiEJDAELCyAGQQFqIQYMAQsLC+kCAwV/BHsBfCACQQJ0IQcgAkF4cUECdCEIA0AgAyAESARAIAcgACADIAdsaiIGaiEJIAYgCGohCiABIQL9DAAAAAAAAAAAAAAAAAAAAAAhC/0MAAAAAAAAAAAAAAAAAAAAACEM/QwAAAAAAAAAAAAAAAAAAAAAIQ39DAAAAAAAAAAAAAAAAAAAAAAhDgNAIAYgCkkEQCALIAb9XQMA/V8gAv0ABAD98gH98AEhCyAMIAb9XQMI/V8gAv0ABBD98gH98AEhDCANIAb9XQMQ/V8gAv0ABCD98gH98AEhDSAOIAb9XQMY/V8gAv0ABDD98gH98AEhDiAGQSBqIQYgAkFAayECDAELCyALIAz98AEgDSAO/fAB/fABIgv9IQAgC/0hAaAhDwNAIAYgCUkEQCAPIAYqAgC7IAIrAwCioCEPIAZBBGohBiACQQhqIQIMAQsLIAUgA0EDdGogDzkDACADQQFqIQMMAQsLC+gFAwl/C3sBfCACQQN0IgggA2whByAEIAhsIQsgAiACQQNxayEMA0AgAiAKSgRAIApBACAGGyEEA0AgAiAESgRAIAQgDEggCiAMSHEEQCACQQN0IQj9DAAAAAAAAAAAAAAAAAAAAAAhEP0MAAAAAAAAAAAAAAAAAAAAACER/QwAAAAAAAAAAAAAAAAAAAAAIRL9DAAAAAAAAAAAAAAAAAAAAAAhE/0MAAAAAAAAAAAAAAAAAAAAACEU/QwAAAAAAAAAAAAAAAAAAAAAIRX9DAAAAAAAAAAAAAAAAAAAAAAhFv0MAAAAAAAAAAAAAAAAAAAAACEXIAAgCkEDdGohCSABIARBA3RqIQ0gByEDA0AgAyALSQRAIBAgAyAJaiIOKwMA/RQiGSADIA1qIg/9AAQAIhj98gH98AEhECARIBkgD/0ABBAiGf3yAf3wASERIBIgDisDCP0UIhogGP3yAf3wASESIBMgGiAZ/fIB/fABIRMgFCAOKwMQ/RQiGiAY/fIB/fABIRQgFSAaIBn98gH98AEhFSAWIA4rAxj9FCIaIBj98gH98AEhFiAXIBogGf3yAf3wASEXIAMgCGohAwwBCwsgBSACIApsIARqQQN0aiIDIBD9CwQAIAMgEf0LBBAgAyAIaiIDIBL9CwQAIAMgE/0LBBAgAyAIaiIDIBT9CwQAIAMgFf0LBBAgAyAIaiIDIBb9CwQAIAMgF/0LBBAFIAJBA3QhDSAKQQRqIgMgAiACIANKGyEOIARBBGoiAyACIAIgA0obIQ8gCiEDA0AgAyAOSARAIAQhCANAIAggD0gEQEQAAAAAAAAAACEbIAchCQNAIAkgC0kEQCAbIAAgCWogA0EDdGorAwAgASAJaiAIQQN0aisDAKKgIRsgCSANaiEJDAELCyAFIAIgA2wgCGpBA3RqIBs5AwAgCEEBaiEIDAELCyADQQFqIQMMAQsLCyAEQQRqIQQMAQsLIApBBGohCgwBCwsL+AIDBH8GewF9A0AgAyAESARAIAAgAiADbGoiByACaiEIIAcgAkFwcWohCSABIQb9DAAAAAAAAAAAAAAAAAAAAAAhCv0MAAAAAAAAAAAAAAAAAAAAACEL/QwAAAAAAAAAAAAAAAAAAAAAIQz9DAAAAAAAAAAAAAAAAAAAAAAhDQNAIAcgCUkEQCAKIAf9AAQAIg/9hwEiDv2nAf36ASAG/QAEAP3mAf3kASEKIAsgDv2oAf36ASAG/QAEEP3mAf3kASELIAwgD/2IASIO/acB/foBIAb9AAQg/eYB/eQBIQwgDSAO/agB/foBIAb9AAQw/eYB/eQBIQ0gB0EQaiEHIAZBQGshBgwBCwsgCiAL/eQBIAwgDf3kAf3kASIK/R8AIAr9HwGSIAr9HwIgCv0fA5KSIRADQCAHIAhJBEAgECAHLAAAsiAGKgIAlJIhECAHQQFqIQcgBkEEaiEGDAELCyAFIANBA3RqIBC7OQMAIANBAWohAwwBCwsL";

// src/core/matrix/wasm/kernelModule.ts
var MAX_PAGES = 65536;
function kernelModuleBytes() {
  const text = atob(KERNELS_WASM_BASE64);
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
  return bytes;
}
var compiled;
function kernelModule() {
  if (compiled !== void 0) return compiled;
  try {
    const bytes = kernelModuleBytes();
    compiled = typeof SharedArrayBuffer === "function" && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
  } catch {
    compiled = null;
  }
  return compiled;
}
function instantiateKernelModule(module, memory) {
  return new WebAssembly.Instance(module, { env: { memory } }).exports;
}

// src/core/matrix/wasm/wasmArena.ts
var PAGE = 65536;
var ALIGN = 16;
var GROW_SLACK_PAGES = 64;
function instantiateKernels(module, memory) {
  return instantiateKernelModule(module, memory);
}
var WasmArena = class {
  memory;
  top = ALIGN;
  /** Bytes below this offset may hold old data; above it the memory is as grown (zero). */
  clean = 0;
  buffers = /* @__PURE__ */ new WeakSet();
  constructor(memory) {
    this.memory = memory ?? new WebAssembly.Memory({ initial: 16, maximum: MAX_PAGES, shared: true });
    this.buffers.add(this.memory.buffer);
  }
  mark() {
    return this.top;
  }
  release(mark) {
    this.top = Math.min(this.top, Math.max(ALIGN, mark));
  }
  float64(n2) {
    const p = this.alloc(n2 * 8);
    return this.zeroed(new Float64Array(this.memory.buffer, p, n2), p);
  }
  float32(n2) {
    const p = this.alloc(n2 * 4);
    return this.zeroed(new Float32Array(this.memory.buffer, p, n2), p);
  }
  int32(n2) {
    const p = this.alloc(n2 * 4);
    return this.zeroed(new Int32Array(this.memory.buffer, p, n2), p);
  }
  /** Memory above the highest point ever handed out is still zero from growing; below it, clear. */
  zeroed(a, p) {
    if (p < this.clean) a.subarray(0, Math.ceil((Math.min(this.clean, p + a.byteLength) - p) / a.BYTES_PER_ELEMENT)).fill(0);
    this.clean = Math.max(this.clean, p + a.byteLength);
    return a;
  }
  /** The byte offset of an array that lives in this memory, or -1. */
  offsetOf(a) {
    return this.buffers.has(a.buffer) ? a.byteOffset : -1;
  }
  alloc(bytes) {
    const p = this.top;
    const end = p + Math.ceil(Math.max(bytes, 1) / ALIGN) * ALIGN;
    const have = this.memory.buffer.byteLength;
    if (end > have) {
      this.memory.grow(Math.ceil((end - have) / PAGE) + GROW_SLACK_PAGES);
      this.buffers.add(this.memory.buffer);
    }
    this.top = end;
    return p;
  }
};

// src/core/matrix/wasm/wasmExecutor.ts
var WasmExecutor = class {
  threads = 1;
  arena;
  kernels;
  /** Use createWasmExecutor(), which checks that WebAssembly SIMD is available. */
  constructor(module, arena = new WasmArena()) {
    this.arena = arena;
    this.kernels = instantiateKernels(module, arena.memory);
  }
  float64(n2) {
    return this.arena.float64(n2);
  }
  float32(n2) {
    return this.arena.float32(n2);
  }
  int32(n2) {
    return this.arena.int32(n2);
  }
  scratchArray;
  /** Frees the arena memory allocated while fn ran (results must be copied out before). */
  scoped(fn) {
    const mark = this.arena.mark();
    const scratch = this.scratchArray;
    try {
      return fn();
    } finally {
      this.arena.release(mark);
      this.scratchArray = scratch;
    }
  }
  /** A reusable arena array of at least n numbers (valid until the next call or scope end). */
  scratch(n2) {
    if (!this.scratchArray || this.scratchArray.length < n2) this.scratchArray = this.arena.float64(n2);
    return this.scratchArray.subarray(0, n2);
  }
  spmm(m, x, l, y, sequential = false) {
    const out = this.out(y);
    const f32 = m.values instanceof Float32Array && this.arena.offsetOf(m.values) >= 0;
    const values = f32 ? m.values.byteOffset : this.ptr(m.values);
    (f32 ? this.kernels.spmm_f32 : this.kernels.spmm)(
      this.ptr(m.indptr),
      this.ptr(m.indices),
      values,
      this.ptr(x),
      l,
      out.ptr,
      0,
      m.rows,
      sequential ? 0 : 1
    );
    out.done();
  }
  cross(a, b, rows, l) {
    const symmetric = a === b;
    const pa = this.ptr(a);
    const pb = symmetric ? pa : this.ptr(b);
    const g = new Float64Array(l * l);
    const part = this.scratch(l * l);
    for (let t = 0; t < reductionBlocks(rows); t++) {
      this.kernels.cross(
        pa,
        pb,
        l,
        t * REDUCTION_BLOCK_ROWS,
        Math.min(rows, (t + 1) * REDUCTION_BLOCK_ROWS),
        part.byteOffset,
        symmetric ? 1 : 0
      );
      addInto(g, part);
    }
    return symmetric ? mirrorUpper(g, l) : g;
  }
  timesSmall(y, rows, l, wt, c, upper, out) {
    const w = this.untransposed(wt, l, c);
    const o = this.out(out);
    this.kernels.times(this.ptr(y), l, w, c, upper ? 1 : 0, o.ptr, 0, rows);
    o.done();
  }
  gaussian(out, rows, l, seed) {
    serialExecutor.gaussian(out, rows, l, seed);
  }
  /** W (l × c) in the arena from its transpose wt (c × l); returns the byte offset. */
  untransposed(wt, l, c) {
    const w = this.arena.float64(l * c);
    for (let b = 0; b < c; b++) for (let a = 0; a < l; a++) w[a * c + b] = wt[b * l + a];
    return w.byteOffset;
  }
  /** Byte offset of an input array, copying it into the arena (as f64 for floats) if needed. */
  ptr(a) {
    const p = a instanceof Float32Array ? -1 : this.arena.offsetOf(a);
    if (p >= 0) return p;
    const copy = a instanceof Int32Array ? this.arena.int32(a.length) : this.arena.float64(a.length);
    copy.set(a);
    return copy.byteOffset;
  }
  /** An output target in the arena, copied back to the caller's array when it lives elsewhere. */
  out(y) {
    const p = y instanceof Float32Array ? -1 : this.arena.offsetOf(y);
    if (p >= 0) return { ptr: p, done: () => void 0 };
    const tmp = this.arena.float64(y.length);
    return { ptr: tmp.byteOffset, done: () => y.set(tmp) };
  }
};
function createWasmExecutor() {
  const module = kernelModule();
  return module ? new WasmExecutor(module) : void 0;
}

// src/core/svd/chooseK.ts
function autoK(files) {
  if (files >= 1e3) return Math.round(Math.min(300, Math.max(100, 100 + 100 * Math.log10(files / 1e3))));
  return Math.min(100, Math.max(2, Math.round(files / 10 + 2 * Math.sqrt(files))));
}
function chooseK(requested, files, terms) {
  const want = requested === "auto" ? autoK(files) : Math.max(1, Math.floor(requested));
  const limit = Math.max(1, Math.min(files, terms));
  return { k: Math.min(want, limit), requested: want, clamped: want > limit };
}

// src/core/matrix/dense.ts
function gram(y) {
  const l = y.cols;
  const g = new Float64Array(l * l);
  const d = y.data;
  for (let i = 0; i < y.rows; i++) {
    const o = i * l;
    for (let a = 0; a < l; a++) {
      const va = d[o + a];
      if (va === 0) continue;
      const ga = a * l;
      for (let b = a; b < l; b++) g[ga + b] += va * d[o + b];
    }
  }
  for (let a = 0; a < l; a++) for (let b = 0; b < a; b++) g[a * l + b] = g[b * l + a];
  return g;
}
function cholesky(g, l) {
  const r = new Float64Array(l * l);
  let maxDiag = 0;
  for (let i = 0; i < l; i++) maxDiag = Math.max(maxDiag, g[i * l + i]);
  const tol = maxDiag * l * Number.EPSILON * 16;
  for (let j = 0; j < l; j++) {
    let s = g[j * l + j];
    for (let k = 0; k < j; k++) s -= r[k * l + j] * r[k * l + j];
    if (!(s > tol)) return null;
    const rjj = Math.sqrt(s);
    r[j * l + j] = rjj;
    for (let i = j + 1; i < l; i++) {
      let t = g[j * l + i];
      for (let k = 0; k < j; k++) t -= r[k * l + j] * r[k * l + i];
      r[j * l + i] = t / rjj;
    }
  }
  return r;
}
function solveUpperRight(y, r) {
  const l = y.cols;
  const d = y.data;
  for (let i = 0; i < y.rows; i++) {
    const o = i * l;
    for (let j = 0; j < l; j++) {
      let s = d[o + j];
      for (let k = 0; k < j; k++) s -= d[o + k] * r[k * l + j];
      d[o + j] = s / r[j * l + j];
    }
  }
}
function timesSmall(y, w, c) {
  const l = y.cols;
  const out = denseBlock(y.rows, c);
  const d = y.data;
  const o2 = out.data;
  for (let i = 0; i < y.rows; i++) {
    const o = i * l;
    const oo = i * c;
    for (let a = 0; a < l; a++) {
      const v = d[o + a];
      if (v === 0) continue;
      const wa = a * c;
      for (let b = 0; b < c; b++) o2[oo + b] += v * w[wa + b];
    }
  }
  return out;
}
function multiplySmall(a, b, p, q, r) {
  const c = new Float64Array(p * r);
  for (let i = 0; i < p; i++)
    for (let k = 0; k < q; k++) {
      const v = a[i * q + k];
      if (v === 0) continue;
      for (let j = 0; j < r; j++) c[i * r + j] += v * b[k * r + j];
    }
  return c;
}

// node_modules/ml-matrix/matrix.mjs
var matrix = __toESM(require_matrix(), 1);
var EigenvalueDecomposition2 = matrix.EigenvalueDecomposition;
var Matrix2 = matrix.Matrix;
var matrix_default = matrix.default.Matrix ? matrix.default.Matrix : matrix.Matrix;

// src/core/matrix/orthonormalize.ts
function orthonormalize(y, random) {
  const l = y.cols;
  const r1 = cholesky(gram(y), l);
  if (r1) {
    solveUpperRight(y, r1);
    const r2 = cholesky(gram(y), l);
    if (r2) {
      solveUpperRight(y, r2);
      return { q: y, r: multiplySmall(r2, r1, l, l, l), replaced: 0 };
    }
    const fb = svqb(y, random);
    return { q: fb.q, r: multiplySmall(fb.r, r1, l, l, l), replaced: fb.replaced };
  }
  return svqb(y, random);
}
function svqb(y, random) {
  const l = y.cols;
  const g = gram(y);
  const evd = new EigenvalueDecomposition2(new Matrix2(toRows(g, l)), { assumeSymmetric: true });
  const lambda = evd.realEigenvalues;
  const w = evd.eigenvectorMatrix;
  const maxL = Math.max(...lambda.map((v) => Math.abs(v)), 0);
  const tol = maxL * l * Number.EPSILON * 1e3;
  const order = Array.from({ length: l }, (_, j) => j).sort((a, b) => lambda[b] - lambda[a] || a - b);
  const scaled = new Float64Array(l * l);
  const rMat = new Float64Array(l * l);
  const bad = [];
  for (let j = 0; j < l; j++) {
    const src = order[j];
    const lam = lambda[src];
    const good = lam > tol;
    if (!good) bad.push(j);
    const s = good ? 1 / Math.sqrt(lam) : 0;
    const rs = good ? Math.sqrt(lam) : 0;
    for (let i = 0; i < l; i++) {
      scaled[i * l + j] = w.get(i, src) * s;
      rMat[j * l + i] = w.get(i, src) * rs;
    }
  }
  const q = timesSmall(y, scaled, l);
  for (const j of bad) for (let i = 0; i < q.rows; i++) q.data[i * l + j] = random.normal();
  gramSchmidtTwice(q);
  return { q, r: rMat, replaced: bad.length };
}
function gramSchmidtTwice(q) {
  const { rows, cols: l, data } = q;
  for (let pass = 0; pass < 2; pass++) {
    for (let j = 0; j < l; j++) {
      for (let p = 0; p < j; p++) {
        let dot2 = 0;
        for (let i = 0; i < rows; i++) dot2 += data[i * l + p] * data[i * l + j];
        for (let i = 0; i < rows; i++) data[i * l + j] -= dot2 * data[i * l + p];
      }
      let ss = 0;
      for (let i = 0; i < rows; i++) ss += data[i * l + j] ** 2;
      const norm = Math.sqrt(ss);
      for (let i = 0; i < rows; i++) data[i * l + j] = norm > 0 ? data[i * l + j] / norm : 0;
    }
  }
}
function toRows(a, l) {
  const rows = [];
  for (let i = 0; i < l; i++) rows.push(Array.from(a.subarray(i * l, (i + 1) * l)));
  return rows;
}

// src/core/matrix/choleskyQr.ts
function choleskyQr(ex, y, rows, l, passes, random) {
  for (let pass = 0; pass < passes; pass++) {
    const r = cholesky(ex.cross(y, y, rows, l), l);
    if (!r) {
      const q = orthonormalize({ rows, cols: l, data: y }, random).q.data;
      if (q !== y) y.set(q);
      return y;
    }
    ex.timesSmall(y, rows, l, invertUpperTransposed(r, l), l, true, y);
  }
  return y;
}
function invertUpperTransposed(r, l) {
  const xt = new Float64Array(l * l);
  for (let j = 0; j < l; j++) {
    const o = j * l;
    xt[o + j] = 1 / r[j * l + j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let t = i + 1; t <= j; t++) s += r[i * l + t] * xt[o + t];
      xt[o + i] = -s / r[i * l + i];
    }
  }
  return xt;
}

// src/core/svd/rayleighRitz.ts
var RANK_TOLERANCE = 1e-12;
var WEAK = 1e-4;
function topEigenpairs(g, l, k) {
  const rows = [];
  for (let i = 0; i < l; i++) {
    const row = new Array(l);
    for (let j = 0; j < l; j++) row[j] = 0.5 * (g[i * l + j] + g[j * l + i]);
    rows.push(row);
  }
  const evd = new EigenvalueDecomposition2(new Matrix2(rows), { assumeSymmetric: true });
  const lambda = evd.realEigenvalues;
  const vec = evd.eigenvectorMatrix;
  const order = Array.from({ length: l }, (_, i) => i).sort((a, b) => lambda[b] - lambda[a] || a - b).slice(0, k);
  const top = Math.max(lambda[order[0]], 0);
  const s = Float64Array.from(order, (i) => lambda[i] > RANK_TOLERANCE * top ? Math.sqrt(lambda[i]) : 0);
  const w = new Float64Array(l * k);
  for (let c = 0; c < k; c++) for (let i = 0; i < l; i++) w[i * k + c] = vec.get(i, order[c]);
  return { s, w };
}
function transposeScaled(w, l, k, scale) {
  const wt = new Float64Array(k * l);
  for (let i = 0; i < l; i++) for (let c = 0; c < k; c++) wt[c * l + i] = w[i * k + c] * (scale ? scale[c] : 1);
  return wt;
}
function bigSideVectors(ex, z, smallVectors, at, l, pairs, k) {
  const b = at.rows;
  const inv = Float64Array.from(pairs.s, (v) => v > 0 ? 1 / v : 0);
  const nnz = at.indptr[at.rows];
  if (b * l <= 2 * nnz) {
    const out2 = ex.float64(b * k);
    ex.timesSmall(z, b, l, transposeScaled(pairs.w, l, k, inv), k, false, out2);
    return out2;
  }
  const out = z.subarray(0, b * k);
  ex.spmm(at, smallVectors, k, out);
  for (let i = 0; i < b; i++) for (let c = 0; c < k; c++) out[i * k + c] *= inv[c];
  return out;
}
function repairWeakColumns(v, rows, k, s, random) {
  const top = s[0];
  const done = Uint8Array.from(s, (x) => top > 0 && x >= WEAK * top ? 1 : 0);
  let repaired = 0;
  for (let c = 0; c < k; c++) {
    if (done[c]) continue;
    repaired++;
    for (let attempt = 0; attempt < 4; attempt++) {
      const before = normalizeColumn(v, rows, k, c);
      for (let sweep = 0; sweep < 2; sweep++) {
        for (let p = 0; p < k; p++) {
          if (!done[p]) continue;
          let dot2 = 0;
          for (let i = 0; i < rows; i++) dot2 += v[i * k + p] * v[i * k + c];
          for (let i = 0; i < rows; i++) v[i * k + c] -= dot2 * v[i * k + p];
        }
      }
      if (before > 0 && normalizeColumn(v, rows, k, c) > 1e-6) break;
      for (let i = 0; i < rows; i++) v[i * k + c] = random.normal();
    }
    done[c] = 1;
  }
  return repaired;
}
function normalizeColumn(v, rows, k, c) {
  let ss = 0;
  for (let i = 0; i < rows; i++) ss += v[i * k + c] ** 2;
  const norm = Math.sqrt(ss);
  if (norm > 0) for (let i = 0; i < rows; i++) v[i * k + c] /= norm;
  return norm;
}

// src/core/svd/randomizedSvd.ts
var DEFAULT_SVD_OPTIONS = Object.freeze({
  powerIterations: 5,
  seed: DEFAULT_SEED
});
function defaultOversampling(k) {
  return Math.max(10, Math.ceil(k / 2), Math.min(k, 100));
}
function randomizedSvd(m, options) {
  const o = { ...DEFAULT_SVD_OPTIONS, ...options };
  const maxRank = Math.min(m.rows, m.cols);
  if (maxRank === 0) throw new InvalidInputError("cannot decompose an empty matrix");
  if (!Number.isInteger(o.k) || o.k < 1) throw new InvalidInputError(`k must be a positive integer, got ${o.k}`);
  if (!Number.isInteger(o.powerIterations) || o.powerIterations < 0)
    throw new InvalidInputError(`powerIterations must be a whole number \u2265 0, got ${o.powerIterations}`);
  const ex = o.executor ?? createWasmExecutor() ?? serialExecutor;
  return ex.scoped ? ex.scoped(() => decompose(m, o, ex)) : decompose(m, o, ex);
}
function decompose(m, o, ex) {
  const maxRank = Math.min(m.rows, m.cols);
  const k = Math.min(o.k, maxRank);
  const l = Math.min(k + (o.oversampling ?? defaultOversampling(k)), maxRank);
  const random = createRandom(o.seed);
  const nnz = m.indptr[m.rows];
  const rowsSmall = m.rows <= m.cols;
  const mCopy = copyCsr(m, ex, "f32");
  const mt = transposeCsr(m, ex, "f32");
  const a = rowsSmall ? mCopy : mt;
  const at = rowsSmall ? mt : mCopy;
  const S = a.rows;
  const B = a.cols;
  const gramOnBigSide = B * l * l <= 2 * (nnz * l + S * l * l);
  const totalPasses = 2 * o.powerIterations + 2 + (gramOnBigSide ? 0 : 1);
  let passes = 0;
  const step = () => {
    if (o.signal?.aborted) throw new CancelledError();
    o.onProgress?.(++passes, totalPasses);
  };
  const z = ex.float64(B * l);
  ex.gaussian(z, B, l, o.seed);
  const q = ex.float64(S * l);
  ex.spmm(a, z, l, q);
  step();
  choleskyQr(ex, q, S, l, o.powerIterations === 0 ? 2 : 1, random);
  for (let it = 0; it < o.powerIterations; it++) {
    ex.spmm(at, q, l, z);
    step();
    ex.spmm(a, z, l, q);
    step();
    choleskyQr(ex, q, S, l, it === o.powerIterations - 1 ? 2 : 1, random);
  }
  ex.spmm(at, q, l, z);
  step();
  let g;
  let spare;
  if (gramOnBigSide) {
    g = ex.cross(z, z, B, l);
  } else {
    const az = ex.float64(S * l);
    ex.spmm(a, z, l, az);
    step();
    g = ex.cross(q, az, S, l);
    spare = az;
  }
  const pairs = topEigenpairs(g, l, k);
  const small = spare ? spare.subarray(0, S * k) : ex.float64(S * k);
  ex.timesSmall(q, S, l, transposeScaled(pairs.w, l, k), k, false, small);
  const big = bigSideVectors(ex, z, small, at, l, pairs, k);
  repairWeakColumns(big, B, k, pairs.s, random);
  const uIn = rowsSmall ? small : big;
  const vIn = rowsSmall ? big : small;
  flipSigns({ rows: m.rows, cols: k, data: uIn }, { rows: m.cols, cols: k, data: vIn });
  const out = o.factors === "f32" ? Float32Array : Float64Array;
  const u = out.from(uIn);
  const v = out.from(vIn);
  return { rows: m.rows, cols: m.cols, k, u, s: pairs.s, v };
}
function flipSigns(u, v) {
  const k = v.cols;
  const bestAbs = new Float64Array(k).fill(-1);
  const bestVal = new Float64Array(k);
  for (let i = 0; i < v.rows; i++) {
    const o = i * k;
    for (let c = 0; c < k; c++) {
      const x = Math.abs(v.data[o + c]);
      if (x > bestAbs[c]) {
        bestAbs[c] = x;
        bestVal[c] = v.data[o + c];
      }
    }
  }
  const sign = Float64Array.from(bestVal, (x) => x < 0 ? -1 : 1);
  if (sign.every((x) => x === 1)) return;
  for (const m of [v, u]) {
    for (let i = 0; i < m.rows; i++) {
      const o = i * k;
      for (let c = 0; c < k; c++) if (sign[c] < 0) m.data[o + c] = -m.data[o + c];
    }
  }
}

// src/core/weighting/prune.ts
var DEFAULT_PRUNE_OPTIONS = Object.freeze({ minDocs: 2, maxDocFraction: 0.5, maxTerms: 1e5 });
function documentFrequencies(docs, vocabSize) {
  const df = new Int32Array(vocabSize);
  for (const d of docs) for (let i = 0; i < d.termIds.length; i++) df[d.termIds[i]]++;
  return df;
}
function pruneVocabulary(docs, vocabSize, options = {}) {
  const o = { ...DEFAULT_PRUNE_OPTIONS, ...options };
  if (!(o.minDocs >= 1) || !(o.maxDocFraction > 0 && o.maxDocFraction <= 1) || !(o.maxTerms >= 1)) {
    throw new InvalidInputError("pruning needs minDocs \u2265 1, 0 < maxDocFraction \u2264 1 and maxTerms \u2265 1");
  }
  const df = documentFrequencies(docs, vocabSize);
  const n2 = docs.length;
  const pick = (minDocs, maxDocs) => {
    const ids2 = [];
    for (let t = 0; t < vocabSize; t++) if (df[t] >= minDocs && df[t] <= maxDocs) ids2.push(t);
    return ids2;
  };
  let relaxed = false;
  let ids = pick(o.minDocs, Math.floor(o.maxDocFraction * n2));
  if (ids.length === 0) {
    relaxed = true;
    ids = pick(1, n2);
  }
  if (ids.length > o.maxTerms) {
    ids.sort((a, b) => df[b] - df[a] || a - b);
    ids = ids.slice(0, o.maxTerms);
  }
  const keptIds = Int32Array.from(ids).sort();
  const columnOf = new Int32Array(vocabSize).fill(-1);
  for (let c = 0; c < keptIds.length; c++) columnOf[keptIds[c]] = c;
  return { keptIds, columnOf, docFreq: df, relaxed };
}

// src/core/weighting/termWeighting.ts
function globalWeights(docs, columnOf, columns, scheme) {
  const n2 = docs.length;
  const g = new Float64Array(columns);
  if (scheme === "tfidf") {
    const df = new Float64Array(columns);
    for (const d of docs)
      for (let i = 0; i < d.termIds.length; i++) {
        const c = columnOf[d.termIds[i]];
        if (c >= 0) df[c]++;
      }
    for (let c = 0; c < columns; c++) g[c] = Math.log((1 + n2) / (1 + df[c])) + 1;
    return g;
  }
  const gf = new Float64Array(columns);
  for (const d of docs)
    for (let i = 0; i < d.termIds.length; i++) {
      const c = columnOf[d.termIds[i]];
      if (c >= 0) gf[c] += d.counts[i];
    }
  const plogp = new Float64Array(columns);
  for (const d of docs)
    for (let i = 0; i < d.termIds.length; i++) {
      const c = columnOf[d.termIds[i]];
      if (c >= 0) {
        const p = d.counts[i] / gf[c];
        plogp[c] += p * Math.log(p);
      }
    }
  const denom = Math.log(n2 + 1);
  for (let c = 0; c < columns; c++) g[c] = 1 + plogp[c] / denom;
  return g;
}
function localWeight(tf, scheme) {
  return scheme === "tfidf" ? 1 + Math.log(tf) : Math.log1p(tf);
}
function weightDocument(doc, columnOf, weights, scheme) {
  const cols = [];
  const vals = [];
  let ss = 0;
  for (let i = 0; i < doc.termIds.length; i++) {
    const id = doc.termIds[i];
    const c = id < columnOf.length ? columnOf[id] : -1;
    if (c < 0) continue;
    const w = localWeight(doc.counts[i], scheme) * weights[c];
    if (w === 0) continue;
    cols.push(c);
    vals.push(w);
    ss += w * w;
  }
  const norm = Math.sqrt(ss);
  const values = Float64Array.from(vals);
  if (norm > 0) for (let i = 0; i < values.length; i++) values[i] /= norm;
  return { columns: Int32Array.from(cols), values, norm };
}

// src/core/index/model/conceptModel.ts
function buildConceptModelAndVectors(docs, vocabSize, settings, progress = {}) {
  const { model, matrix: matrix2 } = buildModelAndMatrix(docs, vocabSize, settings, progress);
  return { model, vectors: projectMatrixRows(model, matrix2, progress.executor) };
}
function buildModelAndMatrix(docs, vocabSize, settings, progress) {
  if (docs.length === 0) throw new EmptyCorpusError("There are no files to index.");
  const pruned = pruneVocabulary(docs, vocabSize, settings.prune);
  const m = pruned.keptIds.length;
  if (m === 0) throw new EmptyCorpusError("The files contain no indexable words.");
  progress.onProgress?.("weighting", 0, 1);
  const weights = globalWeights(docs, pruned.columnOf, m, settings.weighting);
  const { matrix: matrix2, frobeniusSquared: frob } = weightedMatrix(docs, pruned.columnOf, weights, settings.weighting);
  const { indptr } = matrix2;
  const nnz = matrix2.indices.length;
  if (nnz === 0) throw new EmptyCorpusError("After weighting, no file has an indexable word.");
  progress.onProgress?.("weighting", 1, 1);
  if (progress.signal?.aborted) throw new CancelledError();
  const kChoice = chooseK(settings.k, docs.length, m);
  const svd = randomizedSvd(matrix2, {
    k: kChoice.k,
    seed: settings.seed,
    powerIterations: settings.powerIterations,
    signal: progress.signal,
    executor: progress.executor,
    onProgress: (done, total) => progress.onProgress?.("svd", done, total),
    // The model stores f32 term vectors: rounding on the way out of the executor's memory saves
    // the f64 copy at the build's memory peak.
    factors: "f32"
  });
  const k = svd.k;
  const termVectors = svd.v;
  const axisScale = Float64Array.from(svd.s, (s) => s > 0 ? Math.pow(s, settings.conceptScaling - 1) : 0);
  let residualSum = 0;
  let counted = 0;
  for (let i = 0; i < docs.length; i++) {
    if (indptr[i + 1] === indptr[i]) continue;
    let inside = 0;
    for (let c = 0; c < k; c++) inside += (svd.s[c] * svd.u[i * k + c]) ** 2;
    residualSum += Math.max(0, 1 - inside);
    counted++;
  }
  const model = {
    scheme: settings.weighting,
    k,
    kChoice,
    keptIds: pruned.keptIds,
    columnOf: pruned.columnOf,
    weights,
    termVectors,
    singularValues: svd.s,
    axisScale,
    frobeniusSquared: frob,
    residualMean: counted > 0 ? residualSum / counted : 0,
    pruneRelaxed: pruned.relaxed,
    nonZeros: nnz
  };
  return { model, matrix: matrix2 };
}
function projectMatrixRows(model, matrix2, executor) {
  const ex = executor ?? createWasmExecutor() ?? serialExecutor;
  const run = () => {
    const k = model.k;
    const n2 = matrix2.rows;
    const m = ex === serialExecutor ? matrix2 : copyCsr(matrix2, ex, "f64");
    const tv = ex.float64(model.termVectors.length);
    tv.set(model.termVectors);
    const acc = ex.float64(n2 * k);
    ex.spmm(m, tv, k, acc, true);
    const out = new Float32Array(n2 * k);
    const row = new Float64Array(k);
    for (let i = 0; i < n2; i++) {
      let ss = 0;
      for (let c = 0; c < k; c++) {
        row[c] = acc[i * k + c] * model.axisScale[c];
        ss += row[c] * row[c];
      }
      const norm = Math.sqrt(ss);
      if (norm > 0) for (let c = 0; c < k; c++) out[i * k + c] = row[c] / norm;
    }
    return out;
  };
  return ex.scoped ? ex.scoped(run) : run();
}
function weightedMatrix(docs, columnOf, weights, scheme) {
  const rowsIdx = [];
  const rowsVal = [];
  let nnz = 0;
  for (const d of docs) {
    const w = weightDocument(d, columnOf, weights, scheme);
    rowsIdx.push(w.columns);
    rowsVal.push(w.values);
    nnz += w.columns.length;
  }
  const indptr = new Int32Array(docs.length + 1);
  const indices = new Int32Array(nnz);
  const values = new Float64Array(nnz);
  let frob = 0;
  for (let i = 0, p = 0; i < docs.length; i++) {
    indices.set(rowsIdx[i], p);
    values.set(rowsVal[i], p);
    p += rowsIdx[i].length;
    indptr[i + 1] = p;
    for (const v of rowsVal[i]) frob += v * v;
  }
  return { matrix: { rows: docs.length, cols: weights.length, indptr, indices, values }, frobeniusSquared: frob };
}
function projectTerms(model, terms) {
  const w = weightDocument(terms, model.columnOf, model.weights, model.scheme);
  const k = model.k;
  const acc = new Float64Array(k);
  for (let i = 0; i < w.columns.length; i++) {
    const v = w.values[i];
    const o = w.columns[i] * k;
    for (let c = 0; c < k; c++) acc[c] += v * model.termVectors[o + c];
  }
  let inside = 0;
  for (let c = 0; c < k; c++) inside += acc[c] * acc[c];
  let ss = 0;
  for (let c = 0; c < k; c++) {
    acc[c] *= model.axisScale[c];
    ss += acc[c] * acc[c];
  }
  const norm = Math.sqrt(ss);
  const vector = new Float32Array(k);
  if (norm > 0) for (let c = 0; c < k; c++) vector[c] = acc[c] / norm;
  return { vector, residual: w.columns.length > 0 ? Math.max(0, 1 - inside) : 1, knownTerms: w.columns.length };
}

// src/core/counting/termCounts.ts
var EMPTY_DOC_TERMS = Object.freeze({ termIds: new Int32Array(0), counts: new Float32Array(0), length: 0 });
var encoder = new TextEncoder();
var decoder = new TextDecoder("utf-8");
function termStarts(bytes, count) {
  const starts = new Int32Array(count + 1);
  let n2 = 1;
  for (let i = 0; i < bytes.length; i++) if (bytes[i] === 0) starts[n2++] = i + 1;
  starts[count] = bytes.length + 1;
  return starts;
}
function validStarts(bytes, starts) {
  const count = starts.length - 1;
  if (count === 0) return bytes.length === 0;
  if (starts[0] !== 0 || starts[count] !== bytes.length + 1) return false;
  for (let i = 1; i < count; i++) if (!(starts[i] > starts[i - 1] && bytes[starts[i] - 1] === 0)) return false;
  return starts[count] > starts[count - 1];
}
function compareBytes(bytes, a0, a1, q, q0, q1) {
  const n2 = Math.min(a1 - a0, q1 - q0);
  for (let i = 0; i < n2; i++) {
    const d = bytes[a0 + i] - q[q0 + i];
    if (d !== 0) return d;
  }
  return a1 - a0 - (q1 - q0);
}
function sortedRun(bytes, starts, count, from) {
  let i = Math.max(from, 1);
  while (i < count && compareBytes(bytes, starts[i - 1], starts[i] - 1, bytes, starts[i], starts[i + 1] - 1) < 0) i++;
  return Math.min(i, count);
}
var Vocabulary = class _Vocabulary {
  /** Terms of a saved file: ids below _base, decoded on demand. */
  _bytes = new Uint8Array(0);
  _starts = new Int32Array(1);
  _base = 0;
  /** Ids below this are in ascending byte order (binary search). */
  _sorted = 0;
  /** Terms added since (ids from _base). */
  _added = [];
  /** Term → id for every id from _sorted on, plus sorted ids already looked up (null until needed). */
  _ids = /* @__PURE__ */ new Map();
  /** Every term by id, built on first use of `terms`, then kept in step with add. */
  _all = null;
  _query = new Uint8Array(64);
  constructor(terms = []) {
    for (const t of terms) this.add(t);
  }
  /**
   * A vocabulary over saved bytes (kept, not copied). Returns null when the offsets do not
   * delimit the terms of the bytes or `sorted` is out of range.
   */
  static fromBytes(saved) {
    const { bytes, starts, sorted } = saved;
    const count = starts.length - 1;
    if (count < 0 || !Number.isInteger(sorted) || sorted < 0 || sorted > count || !validStarts(bytes, starts)) return null;
    const v = new _Vocabulary();
    v._bytes = bytes;
    v._starts = starts;
    v._base = count;
    v._sorted = sorted;
    v._ids = null;
    return v;
  }
  /** The terms as bytes for saving (shares memory with a reopened vocabulary: do not modify). */
  toBytes() {
    const count = this.size;
    if (this._added.length === 0) return { bytes: this._bytes, starts: this._starts, sorted: this._base === 0 ? 0 : this._sorted };
    const tail = encoder.encode(this._added.join("\0"));
    const bytes = new Uint8Array(this._bytes.length + (this._base > 0 ? 1 : 0) + tail.length);
    bytes.set(this._bytes);
    bytes.set(tail, bytes.length - tail.length);
    const starts = new Int32Array(count + 1);
    starts.set(this._starts.subarray(0, this._base));
    const offset = bytes.length - tail.length;
    const tailStarts = termStarts(tail, this._added.length);
    for (let i = 0; i < tailStarts.length; i++) starts[this._base + i] = tailStarts[i] + offset;
    const from = this._sorted === this._base ? this._sorted : count;
    return { bytes, starts, sorted: this._sorted < this._base ? this._sorted : sortedRun(bytes, starts, count, from) };
  }
  get size() {
    return this._base + this._added.length;
  }
  /** How many leading saved ids are known to be in ascending byte order (0 if none were saved). */
  get byteOrdered() {
    return this._sorted;
  }
  /** Every term by id (built on first use for a reopened vocabulary; grows with add). */
  get terms() {
    if (this._base === 0) return this._added;
    if (!this._all) {
      const base = decoder.decode(this._bytes).split("\0");
      for (const t of this._added) base.push(t);
      this._all = base;
    }
    return this._all;
  }
  idOf(term) {
    const ids = this._ids ?? this.buildIds();
    const known = ids.get(term);
    if (known !== void 0 || this._sorted === 0) return known;
    const id = this.search(term);
    if (id >= 0) ids.set(term, id);
    return id >= 0 ? id : void 0;
  }
  termOf(id) {
    if (this._all) return this._all[id];
    if (id >= this._base) return this._added[id - this._base];
    if (!(id >= 0)) return void 0;
    return decoder.decode(this._bytes.subarray(this._starts[id], this._starts[id + 1] - 1));
  }
  /** The id of term, adding it if new. */
  add(term) {
    let id = this.idOf(term);
    if (id === void 0) {
      id = this.size;
      this._added.push(term);
      this._all?.push(term);
      this._ids.set(term, id);
    }
    return id;
  }
  /** The map of every id from _sorted on (saved unsorted terms and added ones). */
  buildIds() {
    const ids = /* @__PURE__ */ new Map();
    if (this._sorted < this._base) {
      const rest = decoder.decode(this._bytes.subarray(this._starts[this._sorted])).split("\0");
      rest.forEach((t, i) => ids.set(t, this._sorted + i));
    }
    this._added.forEach((t, i) => ids.set(t, this._base + i));
    this._ids = ids;
    return ids;
  }
  /** Binary search of the byte-ordered ids; -1 when absent. */
  search(term) {
    if (this._query.length < term.length * 3) this._query = new Uint8Array(term.length * 3);
    const qn = encoder.encodeInto(term, this._query).written;
    const q = this._query;
    const starts = this._starts;
    let lo = 0;
    let hi = this._sorted - 1;
    while (lo <= hi) {
      const mid = lo + hi >>> 1;
      const c = compareBytes(this._bytes, starts[mid], starts[mid + 1] - 1, q, 0, qn);
      if (c < 0) lo = mid + 1;
      else if (c > 0) hi = mid - 1;
      else return mid;
    }
    return -1;
  }
};
function countTerms(tokens, vocab, grow) {
  const tally = /* @__PURE__ */ new Map();
  for (const t of tokens) tally.set(t, (tally.get(t) ?? 0) + 1);
  const byId = /* @__PURE__ */ new Map();
  let length = 0;
  for (const [t, c] of tally) {
    const id = grow ? vocab.add(t) : vocab.idOf(t);
    if (id === void 0) continue;
    byId.set(id, c);
    length += c;
  }
  const termIds = Int32Array.from(byId.keys()).sort();
  const counts = new Float32Array(termIds.length);
  for (let i = 0; i < termIds.length; i++) counts[i] = byId.get(termIds[i]);
  return { termIds, counts, length };
}

// src/core/index/model/adoptModel.ts
function adoptSharedModel(shared, vocab, slots, settings, progress = {}) {
  if (shared.tokenize.stem !== settings.tokenize.stem || shared.tokenize.keepCompounds !== settings.tokenize.keepCompounds) {
    throw new InvalidInputError(
      `the shared concept model was counted with tokenizer options ${JSON.stringify(shared.tokenize)}, this index uses ${JSON.stringify(settings.tokenize)}`
    );
  }
  progress.onProgress?.("weighting", 0, 1);
  const local = vocab.terms;
  const model = shared.terms;
  const union = [];
  const localToUnion = new Int32Array(local.length);
  const keptIds = new Int32Array(model.length);
  let i = 0;
  let j = 0;
  while (i < local.length || j < model.length) {
    if (j >= model.length || i < local.length && local[i] < model[j]) {
      localToUnion[i++] = union.length;
      union.push(local[i - 1]);
    } else if (i >= local.length || model[j] < local[i]) {
      keptIds[j++] = union.length;
      union.push(model[j - 1]);
    } else {
      localToUnion[i++] = union.length;
      keptIds[j++] = union.length;
      union.push(model[j - 1]);
    }
  }
  const columnOf = new Int32Array(union.length).fill(-1);
  for (let c = 0; c < keptIds.length; c++) columnOf[keptIds[c]] = c;
  const remapped = slots.map((s) => ({ ...s, terms: remap(s.terms, localToUnion), folded: false, residual: 0 }));
  const docs = remapped.map((s) => s.terms);
  const { matrix: matrix2, frobeniusSquared } = weightedMatrix(docs, columnOf, shared.weights, shared.weighting);
  const k = shared.k;
  const next = {
    scheme: shared.weighting,
    k,
    kChoice: { k, requested: k, clamped: false },
    keptIds,
    columnOf,
    weights: shared.weights,
    termVectors: shared.termVectors,
    singularValues: shared.singularValues,
    axisScale: Float64Array.from(shared.singularValues, (s) => s > 0 ? Math.pow(s, settings.conceptScaling - 1) : 0),
    frobeniusSquared,
    residualMean: 0,
    nonZeros: matrix2.indices.length,
    pruneRelaxed: false
  };
  progress.onProgress?.("weighting", 1, 1);
  const inside = new Float64Array(matrix2.rows * k);
  serialExecutor.spmm(matrix2, Float64Array.from(shared.termVectors), k, inside, true);
  let sum = 0;
  let counted = 0;
  for (let r = 0; r < matrix2.rows; r++) {
    if (matrix2.indptr[r + 1] === matrix2.indptr[r]) {
      remapped[r] = { ...remapped[r], residual: 1 };
      continue;
    }
    let ss = 0;
    for (let c = 0; c < k; c++) ss += inside[r * k + c] ** 2;
    const res = Math.max(0, 1 - ss);
    remapped[r] = { ...remapped[r], residual: res };
    sum += res;
    counted++;
  }
  const adopted = { ...next, residualMean: counted > 0 ? sum / counted : 0 };
  progress.onProgress?.("svd", 1, 1);
  const vectors = projectMatrixRows(adopted, matrix2, progress.executor);
  return { vocab: new Vocabulary(union), slots: remapped, model: adopted, vectors };
}
function remap(t, map) {
  const termIds = new Int32Array(t.termIds.length);
  for (let i = 0; i < termIds.length; i++) termIds[i] = map[t.termIds[i]];
  return { termIds, counts: t.counts, length: t.length };
}

// src/core/index/search/termPostings.ts
var COMPACT_SHARE = 0.25;
var COMPACT_MIN = 256;
var TermPostings = class {
  constructor(docs, tfs, builtAt, df) {
    this.docs = docs;
    this.tfs = tfs;
    this.builtAt = builtAt;
    this.df = df;
  }
  docs;
  tfs;
  builtAt;
  df;
  side = [];
  /** The document of slot, last stamped `was`, held the term and is gone. */
  remove(slot, was) {
    this.df--;
    if (was <= this.builtAt) return;
    const side = this.side;
    for (let p = 0; p < side.length; p += 2)
      if (side[p] === slot) {
        side.splice(p, 2);
        return;
      }
  }
  /** Slot (already stamped `edits`) now holds a document with tf of the term. */
  add(slot, tf, stamp, edits) {
    this.df++;
    this.side.push(slot, tf);
    if (this.side.length > 2 * Math.max(COMPACT_MIN, COMPACT_SHARE * this.docs.length)) this.compact(stamp, edits);
  }
  /** Main entries still current plus the side list, as one main list at edit number `edits`. */
  compact(stamp, edits) {
    const pairs = [];
    for (let i = 0; i < this.docs.length; i++) if (stamp[this.docs[i]] <= this.builtAt) pairs.push([this.docs[i], this.tfs[i]]);
    for (let p = 0; p < this.side.length; p += 2) pairs.push([this.side[p], this.side[p + 1]]);
    pairs.sort((a, b) => a[0] - b[0]);
    this.docs = Int32Array.from(pairs, (e) => e[0]);
    this.tfs = Float32Array.from(pairs, (e) => e[1]);
    this.side = [];
    this.builtAt = edits;
  }
};
var Found = class {
  n = 0;
  slots = new Int32Array(1 << 12);
  tfs = new Float32Array(1 << 12);
  which = new Int32Array(1 << 12);
  push(slot, tf, w) {
    if (this.n === this.slots.length) this.grow();
    this.slots[this.n] = slot;
    this.tfs[this.n] = tf;
    this.which[this.n++] = w;
  }
  grow() {
    const size = this.slots.length * 2;
    const [s, t, w] = [new Int32Array(size), new Float32Array(size), new Int32Array(size)];
    s.set(this.slots);
    t.set(this.tfs);
    w.set(this.which);
    [this.slots, this.tfs, this.which] = [s, t, w];
  }
};
function lowerBound(ids, t, lo, hi) {
  while (lo < hi) {
    const mid = lo + hi >>> 1;
    if (ids[mid] < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
function scan(docs, want, found) {
  const last = want[want.length - 1];
  for (let j = 0; j < docs.length; j++) {
    const d = docs[j];
    if (d === null) continue;
    const ids = d.termIds;
    const hi = ids.length;
    if (hi === 0 || ids[0] > last || ids[hi - 1] < want[0]) continue;
    let lo = 0;
    for (let w = 0; w < want.length && lo < hi; w++) {
      lo = lowerBound(ids, want[w], lo, hi);
      if (lo < hi && ids[lo] === want[w]) found.push(j, d.counts[lo++], w);
    }
  }
}
function collectPostings(docs, want, builtAt) {
  if (want.length === 0) return [];
  const found = new Found();
  scan(docs, want, found);
  const df = new Int32Array(want.length);
  for (let i = 0; i < found.n; i++) df[found.which[i]]++;
  const lists = Array.from(df, (n2) => ({ docs: new Int32Array(n2), tfs: new Float32Array(n2), fill: 0 }));
  for (let i = 0; i < found.n; i++) {
    const l = lists[found.which[i]];
    l.docs[l.fill] = found.slots[i];
    l.tfs[l.fill++] = found.tfs[i];
  }
  return lists.map((l, w) => new TermPostings(l.docs, l.tfs, builtAt, df[w]));
}
var PostingsBlock = class {
  constructor(_offsets, _docs, _tfs, builtAt) {
    this._offsets = _offsets;
    this._docs = _docs;
    this._tfs = _tfs;
    this.builtAt = builtAt;
  }
  _offsets;
  _docs;
  _tfs;
  builtAt;
  /** Term ids below this are covered. */
  get terms() {
    return this._offsets.length - 1;
  }
  /** Term t's main list (views into the block; a compaction replaces them, never writes them). */
  postings(t) {
    const [a, b] = [this._offsets[t], this._offsets[t + 1]];
    return new TermPostings(this._docs.subarray(a, b), this._tfs.subarray(a, b), this.builtAt, b - a);
  }
};
var STEP_DOCS = 32;
var STEP_TERMS = 1 << 16;
var PostingsBuild = class {
  /** docs is kept as given: pass a copy that later edits do not change. */
  constructor(docs, builtAt) {
    this.docs = docs;
    this.builtAt = builtAt;
  }
  docs;
  builtAt;
  _phase = "count";
  _total = 0;
  _next = 0;
  _count = new Int32Array(1024);
  _terms = 0;
  _offsets = new Int32Array(0);
  _docsOut = new Int32Array(0);
  _tfsOut = new Float32Array(0);
  _block = null;
  /** Works while more() says so (at least one step); the block once complete, else null. */
  run(more) {
    do {
      if (this._phase === "count") this.countStep();
      else if (this._phase === "offsets") this.offsetsStep();
      else if (this._phase === "allocate") this.allocate();
      else if (this._phase === "fill") this.fillStep();
      if (this._block) return this._block;
    } while (more());
    return null;
  }
  countStep() {
    const end = Math.min(this.docs.length, this._next + STEP_DOCS);
    for (let j = this._next; j < end; j++) {
      const d = this.docs[j];
      if (d === null || d.termIds.length === 0) continue;
      const top = d.termIds[d.termIds.length - 1] + 1;
      if (top > this._count.length) this._count = grownInt32(this._count, top);
      this._terms = Math.max(this._terms, top);
      countIds(d.termIds, this._count);
    }
    this._next = end;
    if (end < this.docs.length) return;
    this._offsets = new Int32Array(this._terms + 1);
    [this._phase, this._next] = ["offsets", 0];
  }
  /** Prefix sums of the counts, STEP_TERMS terms a step. */
  offsetsStep() {
    const end = Math.min(this._terms, this._next + STEP_TERMS);
    this._total = prefixSums(this._count, this._offsets, this._next, end, this._total);
    this._next = end;
    if (end < this._terms) return;
    this._offsets[this._terms] = this._total;
    this._phase = "allocate";
  }
  /** One buffer for both arrays (one large allocation); the counts become fill positions. */
  allocate() {
    const total = this._total;
    if (2 * total > 2 ** 31 - 1) throw new RangeError(`${total} postings are too many for one block`);
    const buffer = new ArrayBuffer(8 * total);
    this._docsOut = new Int32Array(buffer, 0, total);
    this._tfsOut = new Float32Array(buffer, 4 * total, total);
    this._count.set(this._offsets.subarray(0, this._terms));
    [this._phase, this._next] = ["fill", 0];
  }
  fillStep() {
    const end = Math.min(this.docs.length, this._next + STEP_DOCS);
    for (let j = this._next; j < end; j++) {
      const d = this.docs[j];
      if (d !== null) fillIds(j, d.termIds, d.counts, this._count, this._docsOut, this._tfsOut);
    }
    this._next = end;
    if (end < this.docs.length) return;
    this._block = new PostingsBlock(this._offsets, this._docsOut, this._tfsOut, this.builtAt);
    this._phase = "done";
    this._count = new Int32Array(0);
  }
};
function prefixSums(count, offsets, from, to, total) {
  for (let t = from; t < to; t++) {
    offsets[t] = total;
    total += count[t];
  }
  return total;
}
function countIds(ids, count) {
  for (let i = 0; i < ids.length; i++) count[ids[i]]++;
}
function fillIds(slot, ids, counts, at, docs, tfs) {
  for (let i = 0; i < ids.length; i++) {
    const p = at[ids[i]]++;
    docs[p] = slot;
    tfs[p] = counts[i];
  }
}
function grownInt32(a, size) {
  const g = new Int32Array(Math.max(size, 2 * a.length));
  g.set(a);
  return g;
}

// src/core/index/search/bm25.ts
var DEFAULT_BM25_OPTIONS = Object.freeze({ k1: 1.2, b: 0.75 });
function addMain(p, stamp, norm, idf, k1, out) {
  const { docs, tfs, builtAt } = p;
  for (let i = 0; i < docs.length; i++) {
    const j = docs[i];
    if (stamp[j] > builtAt) continue;
    const tf = tfs[i];
    out[j] += idf * tf * (k1 + 1) / (tf + norm[j]);
  }
}
function addSide(list, norm, idf, k1, out) {
  for (let p = 0; p < list.length; p += 2) {
    const j = list[p];
    const tf = list[p + 1];
    out[j] += idf * tf * (k1 + 1) / (tf + norm[j]);
  }
}
function lengthNorms(docs, lengths, avg, k1, b, out) {
  for (let j = 0; j < docs.length; j++) out[j] = docs[j] !== null ? k1 * (1 - b + b * lengths[j] / Math.max(avg, 1e-9)) : 0;
}
function grown(a, size) {
  if (size <= a.length) return a;
  const g = new Float64Array(Math.max(size, Math.ceil(a.length * 1.25)));
  g.set(a);
  return g;
}
var Bm25Scorer = class {
  _opts;
  _docsOf;
  /** Term id → its postings, for every term asked about so far. */
  _terms = /* @__PURE__ */ new Map();
  /** Edit number of each slot's last setDocument (0: as at construction). */
  _stamp;
  _edits = 0;
  _n = 0;
  _totalLength = 0;
  /** Tokens per slot (0 for empty slots), kept beside the documents for the length norm. */
  _lengths;
  _lengthNorm = new Float64Array(0);
  _normFresh = false;
  /** Every term's main list, once prepare() has finished. */
  _block = null;
  _building = null;
  /** docs[i] may be null for a deleted slot (it then scores 0 and does not count in N). */
  constructor(docs, options = {}) {
    this._opts = { ...DEFAULT_BM25_OPTIONS, ...options };
    this._docsOf = docs.slice();
    this._stamp = new Float64Array(docs.length);
    this._lengths = new Float64Array(docs.length);
    for (let j = 0; j < docs.length; j++) {
      const d = docs[j];
      if (!d) continue;
      this._n++;
      this._totalLength += d.length;
      this._lengths[j] = d.length;
    }
  }
  /** Number of documents containing vocabulary term id. */
  docFrequency(termId) {
    return this.postings([termId])[0].df;
  }
  idf(termId) {
    const df = this.docFrequency(termId);
    return Math.log(1 + (this._n - df + 0.5) / (df + 0.5));
  }
  /** Terms whose postings are held (for tests and memory accounting). */
  get cachedTerms() {
    return this._terms.size;
  }
  /** True once every term's postings are built (prepare() has finished). */
  get prepared() {
    return this._block !== null;
  }
  /**
   * Builds the postings of every term ahead of time, working while more() says so (at least one
   * chunk of documents); true when done. Cheap once done.
   */
  prepare(more = () => true) {
    if (this._block) return true;
    this._building ??= new PostingsBuild(this._docsOf.slice(), this._edits);
    const block = this._building.run(more);
    if (!block) return false;
    const snapshot = this._building.docs;
    this._building = null;
    this.install(block, snapshot);
    return true;
  }
  /** Replaces (or with null removes) the document of a slot; slots past the end are added. */
  setDocument(slot, terms) {
    const old = slot < this._docsOf.length ? this._docsOf[slot] : null;
    while (this._docsOf.length <= slot) this._docsOf.push(null);
    this._stamp = grown(this._stamp, slot + 1);
    this._lengths = grown(this._lengths, slot + 1);
    const was = this._stamp[slot];
    this._stamp[slot] = ++this._edits;
    if (old) {
      this._n--;
      this._totalLength -= old.length;
      for (let i = 0; i < old.termIds.length; i++) this.held(old.termIds[i])?.remove(slot, was);
    }
    if (terms) {
      this._n++;
      this._totalLength += terms.length;
      for (let i = 0; i < terms.termIds.length; i++) this.held(terms.termIds[i])?.add(slot, terms.counts[i], this._stamp, this._edits);
    }
    this._docsOf[slot] = terms;
    this._lengths[slot] = terms ? terms.length : 0;
    this._normFresh = false;
  }
  /** Adds each document's BM25 score for the query terms (ids with their query counts) into out. */
  scoreInto(query, out) {
    const k1 = this._opts.k1;
    const norm = this.lengthNorm();
    const lists = this.postings(query.termIds);
    for (let i = 0; i < query.termIds.length; i++) {
      const p = lists[i];
      if (p.df === 0) continue;
      const idf = this.idfOf(p.df) * query.counts[i];
      addMain(p, this._stamp, norm, idf, k1, out);
      addSide(p.side, norm, idf, k1, out);
    }
  }
  /** BM25 contribution of one query term to one document (for explanations). */
  termScore(termId, queryCount, tf, slot) {
    if (tf <= 0) return 0;
    const k1 = this._opts.k1;
    return this.idf(termId) * queryCount * tf * (k1 + 1) / (tf + this.lengthNorm()[slot]);
  }
  idfOf(df) {
    return Math.log(1 + (this._n - df + 0.5) / (df + 0.5));
  }
  /** The postings of each term id (aligned), building all missing ones in one pass. */
  postings(termIds) {
    let missing = null;
    for (let i = 0; i < termIds.length; i++) if (!this.held(termIds[i])) (missing ??= []).push(termIds[i]);
    if (missing) {
      const want = Int32Array.from(new Set(missing)).sort();
      collectPostings(this._docsOf, want, this._edits).forEach((p, i) => this._terms.set(want[i], p));
    }
    return Array.from(termIds, (t) => this._terms.get(t));
  }
  /** A term's postings if kept or in the prepared block (then taken from it and kept), else undefined. */
  held(t) {
    const p = this._terms.get(t);
    if (p || !this._block || t >= this._block.terms) return p;
    const made = this._block.postings(t);
    this._terms.set(t, made);
    return made;
  }
  /**
   * Takes a block built from `snapshot` at edit number block.builtAt. Terms kept already are
   * current and stay; for slots edited since the snapshot, the block's lists of the terms of the
   * old and new documents are brought up to date as setDocument would have done.
   */
  install(block, snapshot) {
    const fresh = /* @__PURE__ */ new Map();
    const take = (t) => {
      if (this._terms.has(t) || t >= block.terms) return void 0;
      let p = fresh.get(t);
      if (!p) fresh.set(t, p = block.postings(t));
      return p;
    };
    for (let j = 0; j < this._docsOf.length; j++) {
      if (this._stamp[j] <= block.builtAt) continue;
      const [old, now] = [j < snapshot.length ? snapshot[j] : null, this._docsOf[j]];
      if (old) for (let i = 0; i < old.termIds.length; i++) take(old.termIds[i])?.remove(j, block.builtAt);
      if (now) for (let i = 0; i < now.termIds.length; i++) take(now.termIds[i])?.add(j, now.counts[i], this._stamp, this._edits);
    }
    for (const [t, p] of fresh) this._terms.set(t, p);
    this._block = block;
  }
  /** k1·(1 − b + b·|d|/avgdl) per slot (0 for empty slots), recomputed after changes. */
  lengthNorm() {
    if (this._normFresh) return this._lengthNorm;
    const docs = this._docsOf;
    if (this._lengthNorm.length !== docs.length) this._lengthNorm = new Float64Array(docs.length);
    const avg = this._n > 0 ? this._totalLength / this._n : 1;
    const { k1, b } = this._opts;
    lengthNorms(docs, this._lengths, avg, k1, b, this._lengthNorm);
    this._normFresh = true;
    return this._lengthNorm;
  }
};

// src/core/index/search/fusion.ts
var DEFAULT_RANKING_OPTIONS = Object.freeze({
  nearbyLexical: 0.5,
  nearbyTerms: 40,
  feedbackDocs: 5,
  feedbackWeight: 0.25,
  likeWeight: 0.75,
  unlikeWeight: 0.25,
  dropFiller: true,
  coverageBlend: false,
  lengthNorm: 0.75
});
var QUESTION_FILLER = `
happen happens happened happening whether wonder please tell explain someone somebody something
anything anyone anybody really actually exactly just maybe perhaps basically
`.split(/\s+/).filter((w) => w.length > 0 && !STOP_WORDS.has(w));
var POINTING = /\b(?:code|file|files|function|functions|place)\s+(?=(?:that|which|where|whose|who)\b)/giu;
function stripPointing(text) {
  return text.replace(POINTING, "");
}
function distinctiveTerms(doc, count, idf) {
  const n2 = doc.termIds.length;
  if (n2 <= count) return { termIds: Int32Array.from(doc.termIds), counts: Float32Array.from(doc.counts), length: doc.length };
  const score = new Float64Array(n2);
  for (let i = 0; i < n2; i++) score[i] = Math.log1p(doc.counts[i]) * idf(doc.termIds[i]);
  const order = Array.from({ length: n2 }, (_, i) => i).sort((a, b) => score[b] - score[a] || a - b);
  const kept = order.slice(0, count).sort((a, b) => a - b);
  let length = 0;
  for (const i of kept) length += doc.counts[i];
  return { termIds: Int32Array.from(kept, (i) => doc.termIds[i]), counts: Float32Array.from(kept, (i) => doc.counts[i]), length };
}
function mergeTerms(a, b) {
  const ids = [];
  const counts = [];
  let i = 0;
  let j = 0;
  while (i < a.termIds.length || j < b.termIds.length) {
    const ta = i < a.termIds.length ? a.termIds[i] : Infinity;
    const tb = j < b.termIds.length ? b.termIds[j] : Infinity;
    if (ta === tb) {
      ids.push(ta);
      counts.push(a.counts[i++] + b.counts[j++]);
    } else if (ta < tb) {
      ids.push(ta);
      counts.push(a.counts[i++]);
    } else {
      ids.push(tb);
      counts.push(b.counts[j++]);
    }
  }
  return { termIds: Int32Array.from(ids), counts: Float32Array.from(counts), length: a.length + b.length };
}
function rocchio(q, parts) {
  const acc = Float64Array.from(q);
  for (const { weight, vectors } of parts) {
    if (vectors.length === 0 || weight === 0) continue;
    const w = weight / vectors.length;
    for (const v of vectors) for (let c = 0; c < acc.length; c++) acc[c] += w * v[c];
  }
  let ss = 0;
  for (let c = 0; c < acc.length; c++) ss += acc[c] * acc[c];
  if (!(ss > 1e-24)) return null;
  const norm = Math.sqrt(ss);
  return { vector: Float32Array.from(acc, (x) => x / norm), scale: 1 / norm };
}

// src/core/matrix/wasm/codeDotKernel.ts
function codeDotModule() {
  return kernelModule();
}
function instantiateCodeDots(module, memory) {
  return instantiateKernelModule(module, memory);
}

// src/core/index/search/conceptCodes.ts
var PAGE2 = 65536;
var WASM_LIMIT = 2 ** 32;
var RESERVED = /* @__PURE__ */ new WeakMap();
var align16 = (bytes) => Math.ceil(bytes / 16) * 16;
var U32 = 2 ** -24;
var SLACK = 1e-9;
var FILL_ROWS = 512;
var ConceptCodes = class _ConceptCodes {
  constructor(k, memory, kernel, _module) {
    this.k = k;
    this._module = _module;
    this._memory = memory;
    this._kernel = kernel;
  }
  k;
  _module;
  _memory;
  _kernel;
  _capacity = 0;
  _filled = 0;
  _codes = new Int8Array(0);
  _query;
  _sums = new Float64Array(0);
  _scales = new Float64Array(0);
  _errors = new Float64Array(0);
  _center = new Float64Array(0);
  _radius = new Float64Array(0);
  /** The codes of a block, or null where WebAssembly SIMD or memory is not available. */
  static create(k, capacity, rows, n2) {
    const codes = _ConceptCodes.empty(k, capacity);
    codes?.fill(rows, n2, () => true);
    return codes;
  }
  /** Zero codes for capacity rows (fill them with setRows), or null as for create. */
  static empty(k, capacity) {
    const module = k > 0 ? codeDotModule() : null;
    if (!module || _ConceptCodes.bytesFor(k, capacity) > WASM_LIMIT) return null;
    try {
      const memory = _ConceptCodes.memoryFor(_ConceptCodes.bytesFor(k, capacity));
      const codes = new _ConceptCodes(k, memory, instantiateCodeDots(module, memory), module);
      codes.ensureCapacity(capacity);
      return codes;
    } catch {
      return null;
    }
  }
  /** Rows [0, filled) have been coded by fill (or setRow at the end of them). */
  get filled() {
    return this._filled;
  }
  /** Codes rows [filled, n) of the block, FILL_ROWS at a time while more() says so (at least once); true when done. */
  fill(rows, n2, more) {
    for (; ; ) {
      const to = Math.min(n2, this._filled + FILL_ROWS);
      this.setRows(rows, this._filled, to);
      this._filled = Math.max(this._filled, to);
      if (to >= n2) return true;
      if (!more()) return false;
    }
  }
  setRow(slot, v) {
    if (slot === this._filled) this._filled++;
    const k = this.k;
    let max = 0;
    for (let c = 0; c < k; c++) max = Math.max(max, Math.abs(v[c]));
    const s = max / 127;
    let err = 0;
    for (let c = 0; c < k; c++) {
      const code = s > 0 ? Math.max(-127, Math.min(127, Math.round(v[c] / s))) : 0;
      this._codes[slot * k + c] = code;
      const d = v[c] - s * code;
      err += d * d;
    }
    this._scales[slot] = s;
    this._errors[slot] = Math.sqrt(err) * (1 + SLACK) + Number.MIN_VALUE;
  }
  /** setRow for rows [from, to) of a row-major block (k numbers a row): the same codes, one tight loop. */
  setRows(rows, from, to) {
    codeRows(rows, this.k, from, to, this._codes, this._scales, this._errors);
  }
  clearRow(slot) {
    this._codes.fill(0, slot * this.k, (slot + 1) * this.k);
    this._scales[slot] = 0;
    this._errors[slot] = 0;
  }
  ensureCapacity(slots) {
    if (slots <= this._capacity) return;
    const capacity = Math.max(slots, Math.ceil(this._capacity * 1.5));
    const k = this.k;
    const need = _ConceptCodes.bytesFor(k, capacity);
    if (need > WASM_LIMIT) throw new RangeError(`screening codes of ${capacity} documents do not fit one WebAssembly memory`);
    const old = this._capacity;
    if (need > _ConceptCodes.maxBytesFor(this._memory)) {
      const memory = _ConceptCodes.memoryFor(need);
      new Int8Array(memory.buffer, align16(16 + 4 * k), old * k).set(this._codes.subarray(0, old * k));
      this._memory = memory;
      this._kernel = instantiateCodeDots(this._module, memory);
    }
    const have = this._memory.buffer.byteLength;
    if (need > have) this._memory.grow(Math.ceil((need - have) / PAGE2));
    const buffer = this._memory.buffer;
    this._query = new Float32Array(buffer, 16, k);
    this._codes = new Int8Array(buffer, align16(16 + 4 * k), capacity * k);
    this._codes.fill(0, old * k);
    this._sums = new Float64Array(buffer, align16(align16(16 + 4 * k) + capacity * k), capacity);
    const grow = (a) => {
      const b = new Float64Array(capacity);
      b.set(a);
      return b;
    };
    this._scales = grow(this._scales);
    this._errors = grow(this._errors);
    this._center = new Float64Array(capacity);
    this._radius = new Float64Array(capacity);
    this._capacity = capacity;
  }
  /**
   * For rows [0, n): v_j·q lies in [center_j − radius_j, center_j + radius_j]. Views reused by the
   * next call.
   */
  bounds(q, n2) {
    const k = this.k;
    let l1 = 0;
    let l2 = 0;
    for (let c = 0; c < k; c++) {
      this._query[c] = q[c];
      l1 += Math.abs(q[c]);
      l2 += q[c] * q[c];
    }
    this._kernel.code_dots(this._codes.byteOffset, this._query.byteOffset, k, 0, n2, this._sums.byteOffset);
    const norm2 = Math.sqrt(l2) * (1 + SLACK);
    const rounding = k * U32 / (1 - k * U32) * 127 * l1 * (1 + SLACK);
    const center = this._center.subarray(0, n2);
    const radius = this._radius.subarray(0, n2);
    boundRows(this._sums, this._scales, this._errors, norm2, rounding, center, radius);
    return { center, radius };
  }
  /** A shared memory of at least bytes, reserving room to double. */
  static memoryFor(bytes) {
    const maxBytes = Math.min(WASM_LIMIT, Math.max(2 * bytes, 16 * PAGE2));
    const memory = new WebAssembly.Memory({ initial: Math.ceil(bytes / PAGE2), maximum: maxBytes / PAGE2, shared: true });
    RESERVED.set(memory, maxBytes);
    return memory;
  }
  static maxBytesFor(memory) {
    return RESERVED.get(memory) ?? 0;
  }
  static bytesFor(k, capacity) {
    return align16(align16(16 + 4 * k) + capacity * k) + capacity * 8;
  }
};
function roundHalfUp(x) {
  const c = (x + 128.5 | 0) - 128;
  return c - 0.5 > x ? c - 1 : c;
}
function codeRows(rows, k, from, to, codes, scales, errors) {
  for (let j = from; j < to; j++) {
    const base = j * k;
    let max = 0;
    for (let c = base; c < base + k; c++) {
      const a = Math.abs(rows[c]);
      if (a > max) max = a;
    }
    const s = max / 127;
    let err = 0;
    if (s > 0) {
      for (let c = base; c < base + k; c++) {
        const v = rows[c];
        let code = roundHalfUp(v / s);
        if (code > 127) code = 127;
        else if (code < -127) code = -127;
        codes[c] = code;
        const d = v - s * code;
        err += d * d;
      }
    } else {
      for (let c = base; c < base + k; c++) {
        const v = rows[c];
        codes[c] = 0;
        err += v * v;
      }
    }
    scales[j] = s;
    errors[j] = Math.sqrt(err) * (1 + SLACK) + Number.MIN_VALUE;
  }
}
function boundRows(sums, scales, errors, norm2, rounding, center, radius) {
  for (let j = 0; j < center.length; j++) {
    const s = scales[j];
    center[j] = s * sums[j];
    radius[j] = (errors[j] * norm2 + s * rounding) * (1 + SLACK) + 1e-300;
  }
}

// src/core/matrix/wasm/dotKernel.ts
function dotModule() {
  return kernelModule();
}
function instantiateDots(module, memory) {
  return instantiateKernelModule(module, memory);
}

// src/core/index/search/conceptRows.ts
var PAGE3 = 65536;
var align162 = (bytes) => Math.ceil(bytes / 16) * 16;
var WASM_LIMIT2 = 2 ** 32;
var DEFAULT_CONCEPT_ROWS_OPTIONS = Object.freeze({ wasm: true });
function dotRows(rows, k, n2, q, out) {
  const k8 = k - (k & 7);
  for (let j = 0, o = 0; j < n2; j++, o += k) {
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, s5 = 0, s6 = 0, s7 = 0;
    for (let c = 0; c < k8; c += 8) {
      const p = o + c;
      s0 += rows[p] * q[c];
      s1 += rows[p + 1] * q[c + 1];
      s2 += rows[p + 2] * q[c + 2];
      s3 += rows[p + 3] * q[c + 3];
      s4 += rows[p + 4] * q[c + 4];
      s5 += rows[p + 5] * q[c + 5];
      s6 += rows[p + 6] * q[c + 6];
      s7 += rows[p + 7] * q[c + 7];
    }
    let r = s0 + s2 + (s4 + s6) + (s1 + s3 + (s5 + s7));
    for (let c = k8; c < k; c++) r += rows[o + c] * q[c];
    out[j] = r;
  }
}
function wasmStore(module, bytes) {
  const maxBytes = Math.min(WASM_LIMIT2, Math.max(2 * bytes, 16 * PAGE3));
  try {
    const memory = new WebAssembly.Memory({ initial: Math.ceil(bytes / PAGE3), maximum: maxBytes / PAGE3, shared: true });
    return { memory, kernel: instantiateDots(module, memory), maxBytes };
  } catch {
    return null;
  }
}
var ConceptRows = class _ConceptRows {
  /** capacity slots, filled from initial (row-major, capacity × k or fewer numbers) when given. */
  constructor(k, capacity, initial, options = {}) {
    this.k = k;
    const { wasm } = { ...DEFAULT_CONCEPT_ROWS_OPTIONS, ...options };
    const bytes = _ConceptRows.bytesFor(k, capacity);
    this._module = wasm && k > 0 && bytes <= WASM_LIMIT2 ? dotModule() : null;
    this._wasm = this._module ? wasmStore(this._module, bytes) : null;
    this._rows = new Float32Array(0);
    this._scores = new Float64Array(0);
    this._query = new Float64Array(k);
    this.grow(capacity);
    if (initial) this._rows.set(initial.subarray(0, Math.min(initial.length, this._rows.length)));
  }
  k;
  _capacity = 0;
  _rows;
  _scores;
  _query;
  _wasm;
  _module;
  /** True when the SIMD kernel is in use. */
  get usesWasm() {
    return this._wasm !== null;
  }
  get capacity() {
    return this._capacity;
  }
  /** All rows (capacity × k); a view that later growth does not invalidate but does not extend. */
  get rows() {
    return this._rows;
  }
  /** Makes room for at least slots rows (grown by half again, to keep appends cheap). */
  ensureCapacity(slots) {
    if (slots > this._capacity) this.grow(Math.max(slots, Math.ceil(this._capacity * 1.5)));
  }
  setRow(slot, vector) {
    this._rows.set(vector.subarray(0, this.k), slot * this.k);
  }
  clearRow(slot) {
    this._rows.fill(0, slot * this.k, (slot + 1) * this.k);
  }
  /**
   * Dot products of q (k numbers) with rows [0, n). The result is a view reused by the next call:
   * copy what must outlive it.
   */
  dots(q, n2) {
    if (n2 > this._capacity) throw new RangeError(`rows ${n2} exceed capacity ${this._capacity}`);
    const out = this._scores.subarray(0, n2);
    if (this._wasm) {
      for (let c = 0; c < this.k; c++) this._query[c] = q[c];
      this._wasm.kernel.dots(this._rows.byteOffset, this._query.byteOffset, this.k, 0, n2, out.byteOffset);
    } else {
      dotRows(this._rows, this.k, n2, q, out);
    }
    return out;
  }
  /**
   * Dot products of q with the listed rows only (the first count of slots), each the same bits as
   * dots() gives; read them at those slots of the returned view (other entries are stale).
   */
  dotsAt(q, slots, count) {
    const out = this._scores;
    if (this._wasm) {
      for (let c = 0; c < this.k; c++) this._query[c] = q[c];
      const kernel = this._wasm.kernel;
      for (let i = 0; i < count; i++)
        kernel.dots(this._rows.byteOffset, this._query.byteOffset, this.k, slots[i], slots[i] + 1, out.byteOffset);
    } else {
      for (let i = 0; i < count; i++) dotRows(this._rows.subarray(slots[i] * this.k), this.k, 1, q, out.subarray(slots[i]));
    }
    return out;
  }
  static bytesFor(k, capacity) {
    return align162(align162(16 + k * 8) + capacity * k * 4) + capacity * 8;
  }
  grow(capacity) {
    const k = this.k;
    if (!this._wasm) {
      const rows = new Float32Array(capacity * k);
      rows.set(this._rows);
      this._rows = rows;
      this._scores = new Float64Array(capacity);
      this._capacity = capacity;
      return;
    }
    const need = _ConceptRows.bytesFor(k, capacity);
    if (need > WASM_LIMIT2) throw new RangeError(`concept vectors of ${capacity} documents do not fit one WebAssembly memory`);
    const old = this._capacity;
    if (need > this._wasm.maxBytes) {
      const moved = wasmStore(this._module, need);
      if (!moved) throw new RangeError(`no memory for the concept vectors of ${capacity} documents`);
      new Float32Array(moved.memory.buffer, align162(16 + k * 8), old * k).set(this._rows.subarray(0, old * k));
      this._wasm = moved;
    }
    const memory = this._wasm.memory;
    const have = memory.buffer.byteLength;
    if (need > have) memory.grow(Math.ceil((need - have) / PAGE3));
    const buffer = memory.buffer;
    const queryAt = 16;
    const rowsAt = align162(queryAt + k * 8);
    const scoresAt = align162(rowsAt + capacity * k * 4);
    this._query = new Float64Array(buffer, queryAt, k);
    this._rows = new Float32Array(buffer, rowsAt, capacity * k);
    if (old > 0) this._rows.fill(0, old * k);
    this._scores = new Float64Array(buffer, scoresAt, capacity);
    this._capacity = capacity;
  }
};

// src/core/index/search/topN.ts
function topN(scores, n2, accept = () => true) {
  if (n2 <= 0) return [];
  const heapSlots = [];
  const worse = (a, b) => scores[a] < scores[b] || scores[a] === scores[b] && a > b;
  const siftDown = (i) => {
    for (; ; ) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < heapSlots.length && worse(heapSlots[l], heapSlots[m])) m = l;
      if (r < heapSlots.length && worse(heapSlots[r], heapSlots[m])) m = r;
      if (m === i) return;
      [heapSlots[i], heapSlots[m]] = [heapSlots[m], heapSlots[i]];
      i = m;
    }
  };
  const siftUp = (i) => {
    while (i > 0) {
      const p = i - 1 >> 1;
      if (!worse(heapSlots[i], heapSlots[p])) return;
      [heapSlots[i], heapSlots[p]] = [heapSlots[p], heapSlots[i]];
      i = p;
    }
  };
  let bar = Number.NEGATIVE_INFINITY;
  for (let s = 0; s < scores.length; s++) {
    const v = scores[s];
    if (v <= bar && heapSlots.length === n2) continue;
    if (Number.isNaN(v) || !accept(s)) continue;
    if (heapSlots.length < n2) {
      heapSlots.push(s);
      siftUp(heapSlots.length - 1);
    } else {
      heapSlots[0] = s;
      siftDown(0);
    }
    if (heapSlots.length === n2) bar = scores[heapSlots[0]];
  }
  return heapSlots.sort((a, b) => worse(a, b) ? 1 : worse(b, a) ? -1 : 0).map((slot) => ({ slot, score: scores[slot] }));
}

// src/core/index/search/screenedTop.ts
var SLACK2 = 1e-12;
var ScreenScratch = class {
  lower = new Float64Array(0);
  score = new Float64Array(0);
  slots = new Int32Array(0);
  fit(n2) {
    if (this.lower.length >= n2) return;
    const m = Math.ceil(n2 * 1.25);
    this.lower = new Float64Array(m);
    this.score = new Float64Array(m);
    this.slots = new Int32Array(m);
  }
};
function screenedTop(input, scratch) {
  const { codes, rows, q, n: n2, top, accept, a, extra } = input;
  if (top <= 0 || !(a > 0)) return null;
  scratch.fit(n2);
  const { center, radius } = codes.bounds(q, n2);
  const lower = scratch.lower.subarray(0, n2);
  lowerBounds(center, radius, a, extra?.b ?? 0, extra?.values ?? null, lower);
  const best = topN(lower, top, accept);
  if (best.length < top) return null;
  const bar = best[top - 1].score;
  const list = scratch.slots;
  const count = candidates(center, radius, a, extra?.b ?? 0, extra?.values ?? null, bar, accept, list);
  const exact = rows.dotsAt(q, list, count);
  const score = scratch.score.subarray(0, n2).fill(Number.NaN);
  for (let i = 0; i < count; i++) {
    const j = list[i];
    score[j] = extra ? a * exact[j] + extra.b * extra.values[j] : exact[j];
  }
  const ranked = topN(score, top, accept);
  return { ranked, product: (slot) => exact[slot], candidates: count };
}
function lowerBounds(center, radius, a, b, values, out) {
  for (let j = 0; j < out.length; j++) out[j] = a * (center[j] - radius[j]) + (values ? b * values[j] : 0) - SLACK2;
}
function candidates(center, radius, a, b, values, bar, accept, out) {
  let count = 0;
  for (let j = 0; j < center.length; j++) {
    const upper = a * (center[j] + radius[j]) + (values ? b * values[j] : 0) + SLACK2;
    if (upper >= bar && accept(j)) out[count++] = j;
  }
  return count;
}

// src/core/index/update/staleness.ts
var ChangeCounters = class {
  _removedSinceBuild = 0;
  _foldedTokens = 0;
  _foldedUnknownTokens = 0;
  /**
   * A document folded in with these terms; ids from vocabBefore on were new to the vocabulary
   * (counted only for those, so pruned-but-known words do not look "new").
   */
  folded(terms, vocabBefore) {
    let brandNew = 0;
    for (let i = 0; i < terms.termIds.length; i++) if (terms.termIds[i] >= vocabBefore) brandNew += terms.counts[i];
    this._foldedTokens += terms.length;
    this._foldedUnknownTokens += brandNew;
  }
  /** A document removed (one folded in since the build is already counted among the folded). */
  removed(wasFolded) {
    if (!wasFolded) this._removedSinceBuild++;
  }
  get counters() {
    return { removedSinceBuild: this._removedSinceBuild, foldedTokens: this._foldedTokens, foldedUnknownTokens: this._foldedUnknownTokens };
  }
  restore(c) {
    this._removedSinceBuild = c.removedSinceBuild;
    this._foldedTokens = c.foldedTokens;
    this._foldedUnknownTokens = c.foldedUnknownTokens;
  }
  /** Staleness of an index with these slots (null for holes), `size` live documents and model residual mean. */
  measure(slots, size, residualMean) {
    let folded = 0;
    let residual = 0;
    for (const s of slots)
      if (s?.folded) {
        folded++;
        residual += s.residual;
      }
    const changed = folded + this._removedSinceBuild;
    const base = size + this._removedSinceBuild;
    return {
      changedFiles: changed,
      changedShare: base > 0 ? changed / base : 0,
      newTermMass: this._foldedTokens > 0 ? this._foldedUnknownTokens / this._foldedTokens : 0,
      residualRatio: folded > 0 && residualMean > 0 ? residual / folded / residualMean : folded > 0 ? Infinity : 1
    };
  }
};

// src/core/sections/sectionStore.ts
var SectionStore = class {
  constructor(k) {
    this.k = k;
  }
  k;
  _files = /* @__PURE__ */ new Map();
  _count = 0;
  /** Files that have sections. */
  get files() {
    return this._files.size;
  }
  /** Sections over all files. */
  get count() {
    return this._count;
  }
  get(path) {
    return this._files.get(path);
  }
  /** Entries in insertion order (the index file keeps its own order; see serialize.ts). */
  entries() {
    return this._files.entries();
  }
  set(path, sections) {
    const n2 = sections.starts.length;
    if (sections.ends.length !== n2 || sections.titles.length !== n2 || sections.vectors.length !== n2 * this.k)
      throw new InvalidInputError(`the sections of "${path}" disagree in size (k = ${this.k})`);
    this.delete(path);
    this._files.set(path, sections);
    this._count += n2;
  }
  delete(path) {
    const old = this._files.get(path);
    if (!old) return;
    this._count -= old.starts.length;
    this._files.delete(path);
  }
  /** The section of a file holding a zero-based line (the last one that starts at or before it), or null. */
  at(path, line) {
    const f = this._files.get(path);
    if (!f || f.starts.length === 0) return null;
    let best = 0;
    for (let i = 0; i < f.starts.length; i++) if (f.starts[i] <= line && line < f.ends[i]) best = i;
    if (line >= f.ends[f.starts.length - 1]) best = f.starts.length - 1;
    return { index: best, vector: f.vectors.subarray(best * this.k, (best + 1) * this.k) };
  }
  /** A file's section with the highest cosine with q, or null when the file has none. */
  best(path, q) {
    const f = this._files.get(path);
    if (!f || f.starts.length === 0) return null;
    let at = 0;
    let top = Number.NEGATIVE_INFINITY;
    for (let i = 0; i < f.starts.length; i++) {
      const s = dot(f.vectors, i * this.k, q, this.k);
      if (s > top) [top, at] = [s, i];
    }
    return this.hit(path, f, at, top);
  }
  /**
   * The `top` sections with the highest cosine with q over files that `accept` lets in, best first
   * (ties: file order, then position). At most `perFile` sections of one file. Exact: every
   * section vector is multiplied.
   */
  rank(q, top, accept = () => true, perFile = Number.POSITIVE_INFINITY) {
    if (q.length !== this.k) throw new InvalidInputError(`query vector has ${q.length} numbers, the sections have ${this.k}`);
    const heap = [];
    let floor = Number.NEGATIVE_INFINITY;
    for (const [path, f] of this._files) {
      if (!accept(path)) continue;
      let taken = 0;
      const scores = [];
      for (let i = 0; i < f.starts.length; i++) {
        const s = dot(f.vectors, i * this.k, q, this.k);
        if (s > floor || heap.length < top) scores.push({ i, score: s });
      }
      scores.sort((a, b) => b.score - a.score || a.i - b.i);
      for (const { i, score } of scores) {
        if (taken++ >= perFile) break;
        heap.push({ path, f, i, score });
      }
      if (heap.length > 4 * top + 64) {
        heap.sort((a, b) => b.score - a.score);
        heap.length = top;
        floor = heap[top - 1].score;
      }
    }
    heap.sort((a, b) => b.score - a.score);
    return heap.slice(0, top).map((h) => this.hit(h.path, h.f, h.i, h.score));
  }
  hit(path, f, i, score) {
    return { path, index: i, start: f.starts[i], end: f.ends[i], title: f.titles[i], score };
  }
};
function dot(block, at, q, k) {
  let s = 0;
  for (let c = 0; c < k; c++) s += block[at + c] * q[c];
  return s;
}

// src/core/sections/codeUnits.ts
var CONTAINER = /^\s*(?:(?:export|default|declare|public|private|protected|internal|static|abstract|sealed|partial|final|pub(?:\([^)]*\))?|unsafe|readonly|async)\s+)*(?:class|interface|struct|trait|impl|namespace|module|record|object|union|mod|extern\s+"C(?:\+\+)?")\b/;
var NAME_PATTERNS = [
  /\bimpl\b(?:\s*<[^>]*>)?\s+([^{]+?)\s*(?:where\b[^{]*)?\{?\s*$/,
  /\b(?:class|interface|struct|enum|trait|namespace|module|record|object|union|mod|type)\s+([A-Za-z_$][\w$.]*)/,
  /\bfunc\s+(?:\([^)]*\)\s*)?([A-Za-z_]\w*)/,
  /\b(?:function\*?|fn|def)\s+([A-Za-z_$][\w$]*)/,
  /^#\s*define\s+([A-Za-z_]\w*)/,
  /\b(?:const|let|var|static)\s+(?:mut\s+)?([A-Za-z_$][\w$]*)\s*[:=<(]/,
  /^\s*(?:(?:public|private|protected|internal|static|readonly|abstract|async|override|virtual|get|set|declare|final|synchronized)\s+)*([A-Za-z_$#][\w$]*)\s*[?!]?\s*(?::|=(?!=)|<[^>(]*>\s*\()/,
  // A function or method: the identifier before the first "(" (C, C++, Java, C#).
  /^\s*(?:[\w$<>[\],.*&:~]+\s+)*?[*&]*([A-Za-z_$~][\w$]*(?:::~?[A-Za-z_$][\w$]*)*)\s*(?:<[^>(]*>)?\s*\(/
];
var NOT_NAMES = /* @__PURE__ */ new Set([
  "if",
  "for",
  "while",
  "switch",
  "return",
  "catch",
  "do",
  "else",
  "new",
  "typeof",
  "sizeof",
  "await",
  "yield",
  "throw",
  "case",
  "using",
  "import",
  "export",
  "require",
  "describe",
  "it",
  "test"
]);
function declaredName(line) {
  for (const re of NAME_PATTERNS) {
    const m = re.exec(line);
    if (m && !NOT_NAMES.has(m[1])) return m[1].replace(/\s+/g, " ").trim();
  }
  return null;
}
function braceFacts(lines3, lang) {
  const out = [];
  let depth = 0;
  let inBlock = false;
  let inTemplate = false;
  for (const line of lines3) {
    const start = depth;
    let code = "";
    for (let i = 0; i < line.length; i++) {
      const c = line[i];
      if (inBlock) {
        if (c === "*" && line[i + 1] === "/") {
          inBlock = false;
          i++;
        }
        continue;
      }
      if (inTemplate) {
        if (c === "\\") i++;
        else if (c === "`") inTemplate = false;
        continue;
      }
      if (c === "/" && line[i + 1] === "/") break;
      if (c === "/" && line[i + 1] === "*") {
        inBlock = true;
        i++;
        continue;
      }
      if (c === "`" && (lang === "ts" || lang === "go")) {
        inTemplate = true;
        code += "`";
        continue;
      }
      if (c === '"' || c === "'" && (lang !== "rust" || /^'(\\.|[^\\'])'/.test(line.slice(i)))) {
        let j = i + 1;
        while (j < line.length && line[j] !== c) j += line[j] === "\\" ? 2 : 1;
        code += c + c;
        i = j;
        continue;
      }
      if (c === "{") depth++;
      else if (c === "}") depth = Math.max(0, depth - 1);
      code += c;
    }
    const t = code.trim();
    out.push({ depth: start, quiet: t === "", blank: line.trim() === "", last: t.at(-1) ?? "", first: t[0] ?? "" });
  }
  return out;
}
var isAttribute = (line, lang) => /^\s*(@[A-Za-z]|#!?\[)/.test(line) || lang === "csharp" && /^\s*\[.*\]\s*$/.test(line);
function braceUnits(lines3, lang) {
  const facts = braceFacts(lines3, lang);
  const units = [];
  const owners = [{ depth: 0, name: "", from: 0 }];
  let prevEnded = true;
  let lead = -1;
  for (let i = 0; i < lines3.length; i++) {
    const f = facts[i];
    while (owners.length > 1 && i >= owners.at(-1).from && f.depth < owners.at(-1).depth) owners.pop();
    const owner = owners.at(-1);
    if (f.depth !== owner.depth) {
      if (!f.quiet) prevEnded = f.last === ";" || f.last === "}" || f.last === "{";
      continue;
    }
    if (f.blank) {
      lead = -1;
      prevEnded = true;
      continue;
    }
    if (f.quiet || isAttribute(lines3[i], lang)) {
      if (lead < 0 && prevEnded) lead = i;
      if (!f.quiet) prevEnded = true;
      continue;
    }
    const continues = !prevEnded || /^[)\]}.,+\-*/&|?:=]/.test(f.first) || lang !== "python" && /^(?:else|catch|finally|where)\b/.test(lines3[i].trim());
    if (!continues) {
      const name = /^\s*(?:import|export\s+\*|export\s+\{|using|package|use|#\s*include|#\s*(?:if|ifdef|ifndef|endif|else|pragma))\b/.test(
        lines3[i]
      ) ? null : declaredName(lines3[i]);
      units.push({ start: lead >= 0 ? lead : i, head: i, name, owner: owner.name });
      if (owners.length <= 3 && CONTAINER.test(lines3[i]) && name) {
        const opens = lines3.slice(i, i + 4).findIndex((_, j) => facts[i + j + 1]?.depth > f.depth);
        if (opens >= 0) owners.push({ depth: f.depth + 1, name: owner.name ? `${owner.name}.${name}` : name, from: i + opens + 1 });
      }
    }
    lead = -1;
    prevEnded = f.last === ";" || f.last === "}" || f.last === "{" || f.last === "," && owner.depth > 0 && lang !== "ts";
    if (!prevEnded && (lang === "go" || lang === "ts") && facts[i + 1]?.depth === owner.depth && /[\w)\]"'`]$/.test(f.last))
      prevEnded = true;
  }
  return units;
}
function pythonUnits(lines3) {
  const units = [];
  let quote = null;
  let classIndent = -1;
  let className = "";
  let memberIndent = -1;
  let lead = -1;
  let openParens = 0;
  for (let i = 0; i < lines3.length; i++) {
    const line = lines3[i];
    const wasInString = quote !== null;
    for (const m of line.matchAll(/"""|'''/g)) {
      if (quote === null) quote = m[0];
      else if (quote === m[0]) quote = null;
    }
    if (wasInString) continue;
    const trimmed = line.trim();
    if (!trimmed) {
      lead = -1;
      continue;
    }
    const indent = line.length - line.trimStart().length;
    const atStart = openParens === 0;
    openParens = Math.max(0, openParens + (line.match(/[([{]/g)?.length ?? 0) - (line.match(/[)\]}]/g)?.length ?? 0));
    if (!atStart) continue;
    if (classIndent >= 0 && indent <= classIndent) classIndent = -1;
    if (classIndent >= 0 && memberIndent < 0) memberIndent = indent;
    const member = classIndent >= 0 && indent === memberIndent;
    if (indent !== 0 && !member) continue;
    if (trimmed.startsWith("#") || trimmed.startsWith("@")) {
      if (lead < 0) lead = i;
      continue;
    }
    const def = /^(?:async\s+)?(def|class)\s+([A-Za-z_]\w*)/.exec(trimmed);
    if (member && !def) {
      lead = -1;
      continue;
    }
    const named = def ? def[2] : /^([A-Za-z_]\w*)\s*(?::[^=]*)?=(?!=)/.exec(trimmed)?.[1] ?? null;
    units.push({
      start: lead >= 0 ? lead : i,
      head: i,
      name: /^(import|from)\s/.test(trimmed) ? null : named,
      owner: member ? className : ""
    });
    lead = -1;
    if (def?.[1] === "class" && indent === 0) {
      classIndent = 0;
      className = def[2];
      memberIndent = -1;
    }
  }
  return units;
}
function codeSections(lines3, lang) {
  const units = lang === "python" ? pythonUnits(lines3) : braceUnits(lines3, lang);
  if (!units.some((u) => u.name)) return null;
  const out = [];
  if (units[0].start > 0 && lines3.slice(0, units[0].start).some((l) => l.trim()))
    out.push({ start: 0, title: firstLine(lines3, 0), named: false, quiet: true });
  for (const u of units) {
    const prev = out.at(-1);
    if (!u.name && prev && !prev.named) {
      if (prev.quiet) out[out.length - 1] = { start: prev.start, title: firstLine(lines3, u.head), named: false };
      continue;
    }
    out.push({
      start: u.start,
      title: u.name ? u.owner ? `${u.owner}.${u.name}` : u.name : firstLine(lines3, u.head),
      named: u.name !== null
    });
  }
  return out.map((s, i) => ({ start: s.start, end: out[i + 1]?.start ?? lines3.length, title: s.title }));
}
function firstLine(lines3, from) {
  const l = lines3.slice(from).find((x) => x.trim()) ?? "";
  const t = l.trim().replace(/\s+/g, " ");
  return t.length > 60 ? `${t.slice(0, 57)}\u2026` : t;
}

// src/core/sections/windows.ts
function lineWindows(from, to, size, overlap, title) {
  const out = [];
  if (to <= from) return out;
  const step = Math.max(1, size - Math.min(overlap, size - 1));
  if (to - from <= size) return [{ start: from, end: to, title: title(from, to) }];
  for (let s = from; ; s += step) {
    const start = Math.min(s, Math.max(from, to - size));
    const end = Math.min(to, start + size);
    out.push({ start, end, title: title(start, end) });
    if (end >= to) break;
  }
  return out;
}
var linesTitle = (start, end) => `lines ${start + 1}\u2013${end}`;

// src/core/sections/headings.ts
var ATX = /^ {0,3}(#{1,6})[ \t]+(.*?)(?:[ \t]+#+)?[ \t]*$/;
var SETEXT = /^ {0,3}(=+|-+)[ \t]*$/;
var FENCE = /^ {0,3}(`{3,}|~{3,})/;
var RST_ADORN = /^([!-/:-@[-`{-~])\1+\s*$/;
var ADOC_HEADING = /^(={1,6})[ \t]+(\S.*?)[ \t]*$/;
var ADOC_DELIM = /^(-{4,}|\.{4,}|\/{4,}|\+{4,}|_{4,}|`{3,})\s*$/;
function markdownHeadings(lines3) {
  const out = [];
  let fence = null;
  let i = 0;
  if (lines3[0]?.trim() === "---") {
    const close = lines3.findIndex((l, j) => j > 0 && /^(---|\.\.\.)\s*$/.test(l));
    if (close > 0) i = close + 1;
  }
  for (; i < lines3.length; i++) {
    const line = lines3[i];
    const f = FENCE.exec(line);
    if (fence) {
      if (f && f[1][0] === fence[0] && f[1].length >= fence.length && line.trim() === f[1]) fence = null;
      continue;
    }
    if (f) {
      fence = f[1];
      continue;
    }
    const atx = ATX.exec(line);
    if (atx && atx[2].trim()) {
      out.push({ line: i, title: atx[2].trim() });
      continue;
    }
    const next = lines3[i + 1];
    if (next !== void 0 && SETEXT.test(next) && line.trim() && !/^ {4}/.test(line) && !/^\s*([-*+>]|\d+[.)])\s/.test(line)) {
      if (i === 0 || !lines3[i - 1].trim() || out.at(-1)?.line === i - 2) {
        out.push({ line: i, title: line.trim() });
        i++;
      }
    }
  }
  return out;
}
function rstHeadings(lines3) {
  const out = [];
  for (let i = 0; i + 1 < lines3.length; i++) {
    const title = lines3[i].trimEnd();
    const under = RST_ADORN.exec(lines3[i + 1]);
    if (!under || !title.trim() || RST_ADORN.test(title)) continue;
    if (lines3[i + 1].trimEnd().length < title.trim().length) continue;
    const over = i > 0 && lines3[i - 1].trimEnd() === lines3[i + 1].trimEnd();
    if (!over && /^\s/.test(title)) continue;
    out.push({ line: over ? i - 1 : i, title: title.trim() });
    i++;
  }
  return out;
}
function asciidocHeadings(lines3) {
  const out = [];
  let delim = null;
  for (let i = 0; i < lines3.length; i++) {
    const d = ADOC_DELIM.exec(lines3[i]);
    if (delim) {
      if (d && d[1] === delim) delim = null;
      continue;
    }
    if (d) {
      delim = d[1];
      continue;
    }
    const h = ADOC_HEADING.exec(lines3[i]);
    if (h) out.push({ line: i, title: h[2] });
  }
  return out;
}
function headingSections(lines3, kind) {
  const found = kind === "markdown" ? markdownHeadings(lines3) : kind === "rst" ? rstHeadings(lines3) : asciidocHeadings(lines3);
  if (found.length === 0) return null;
  const out = [];
  if (found[0].line > 0 && lines3.slice(0, found[0].line).some((l) => l.trim())) {
    out.push({ start: 0, end: found[0].line, title: linesTitle(0, found[0].line) });
  }
  found.forEach((h, i) => out.push({ start: h.line, end: found[i + 1]?.line ?? lines3.length, title: h.title }));
  return out;
}

// src/core/sections/types.ts
var DEFAULT_SECTION_OPTIONS = {
  windowLines: 60,
  windowOverlap: 15,
  maxLines: 200,
  minLines: 3,
  maxSections: 400
};

// src/core/sections/splitSections.ts
var MARKUP = {
  md: "markdown",
  markdown: "markdown",
  mdx: "markdown",
  rst: "rst",
  rest: "rst",
  txt: "rst",
  adoc: "asciidoc",
  asciidoc: "asciidoc",
  asc: "asciidoc"
};
var CODE = {
  ts: "ts",
  tsx: "ts",
  mts: "ts",
  cts: "ts",
  js: "ts",
  jsx: "ts",
  mjs: "ts",
  cjs: "ts",
  go: "go",
  java: "java",
  cs: "csharp",
  c: "c",
  h: "c",
  cc: "c",
  cpp: "c",
  cxx: "c",
  hpp: "c",
  hh: "c",
  hxx: "c",
  rs: "rust",
  py: "python",
  pyi: "python"
};
function extensionOf(path) {
  const name = path.slice(path.lastIndexOf("/") + 1);
  const dot2 = name.lastIndexOf(".");
  return dot2 > 0 ? name.slice(dot2 + 1).toLowerCase() : "";
}
function splitLines(text) {
  return text.split(/\r\n|\r|\n/);
}
function splitSections(path, text, options = {}) {
  const o = { ...DEFAULT_SECTION_OPTIONS, ...options };
  if (!(o.windowLines >= 1 && o.windowOverlap >= 0 && o.windowOverlap < o.windowLines && o.maxLines >= 1 && o.minLines >= 0 && o.maxSections >= 1))
    throw new InvalidInputError(
      "section options: windowLines \u2265 1, 0 \u2264 windowOverlap < windowLines, maxLines \u2265 1, minLines \u2265 0, maxSections \u2265 1"
    );
  const lines3 = splitLines(text);
  while (lines3.length > 0 && lines3.at(-1).trim() === "") lines3.pop();
  if (lines3.length === 0) return { kind: "window", sections: [] };
  const ext = extensionOf(path);
  let kind = "window";
  let found = null;
  if (MARKUP[ext]) {
    found = headingSections(lines3, MARKUP[ext]);
    if (!found && ext === "txt") found = headingSections(lines3, "markdown");
    if (found) kind = "headings";
  } else if (CODE[ext]) {
    found = codeSections(lines3, CODE[ext]);
    if (found) kind = "code";
  }
  if (!found) return { kind: "window", sections: lineWindows(0, lines3.length, o.windowLines, o.windowOverlap, linesTitle) };
  return { kind, sections: even(found, lines3, o) };
}
function even(found, lines3, o) {
  const filled = (s) => {
    let n2 = 0;
    for (let i = s.start; i < s.end; i++) if (lines3[i].trim()) n2++;
    return n2;
  };
  const joined = [];
  found.forEach((s, i) => {
    const prev = joined.at(-1);
    const short = filled(s) < o.minLines;
    const header = found[i + 1]?.title.startsWith(`${s.title}.`) === true;
    if (prev && (joined.length >= o.maxSections || short && !header)) joined[joined.length - 1] = { ...prev, end: s.end };
    else if (prev && filled(prev) < o.minLines && s.title.startsWith(`${prev.title}.`))
      joined[joined.length - 1] = { ...s, start: prev.start };
    else joined.push(s);
  });
  if (joined.length > 1 && filled(joined[0]) < o.minLines) joined.splice(0, 2, { ...joined[1], start: joined[0].start });
  const out = [];
  for (const s of joined) {
    if (s.end - s.start <= o.maxLines) {
      out.push(s);
      continue;
    }
    const parts = lineWindows(s.start, s.end, o.maxLines, o.windowOverlap, () => s.title);
    parts.forEach((p, i) => out.push({ ...p, title: `${s.title} (${i + 1}/${parts.length})` }));
  }
  return out;
}

// src/core/sections/sectionVectors.ts
function foldSections(ctx2, path, text, options = {}) {
  const { sections } = splitSections(path, text, options);
  const lines3 = splitLines(text);
  const k = ctx2.model.k;
  const vectors = new Float32Array(sections.length * k);
  sections.forEach((s, i) => {
    const terms = countTerms(tokenize(lines3.slice(s.start, s.end).join("\n"), ctx2.tokenize), ctx2.vocab, false);
    vectors.set(projectTerms(ctx2.model, terms).vector, i * k);
  });
  return {
    starts: Int32Array.from(sections, (s) => s.start),
    ends: Int32Array.from(sections, (s) => s.end),
    titles: sections.map((s) => s.title),
    vectors
  };
}
function foldContextOf(index2) {
  return { model: index2.model, vocab: index2.vocab, tokenize: index2.settings.tokenize };
}

// src/core/index/searchTypes.ts
var DEFAULT_PREPARE_OPTIONS = Object.freeze({
  sliceMs: 15,
  pause: () => new Promise((resolve2) => setTimeout(resolve2, 0))
});

// src/core/index/lsiIndex.ts
var LsiIndex = class _LsiIndex {
  constructor(settings, vocab, model, slots, rows) {
    this.settings = settings;
    this.vocab = vocab;
    this.model = model;
    this._slots = slots;
    this._rows = rows;
    this.sections = new SectionStore(model.k);
    slots.forEach((s, i) => s && this._slotOf.set(s.meta.path, i));
  }
  settings;
  vocab;
  model;
  _slots;
  _rows;
  _slotOf = /* @__PURE__ */ new Map();
  _bm25 = null;
  _scratch = new Float64Array(0);
  _codes;
  _screen = new ScreenScratch();
  _changes = new ChangeCounters();
  _filler = null;
  /** How search and nearby combine their evidence (fusion.ts); not saved with the index. */
  ranking = DEFAULT_RANKING_OPTIONS;
  /** Each file's sections with their concept vectors (src/core/sections), saved with the index. */
  sections;
  /** Builds the document vectors of a fresh model (used by IndexBuilder and by loading). */
  static assemble(settings, vocab, model, slots, vectors) {
    const k = model.k;
    if (vectors && vectors.length < slots.length * k) throw new InvalidInputError("concept vectors do not cover every document");
    const rows = new ConceptRows(k, slots.length, vectors?.subarray(0, slots.length * k));
    if (!vectors) slots.forEach((s, i) => s && rows.setRow(i, projectTerms(model, s.terms).vector));
    return new _LsiIndex(settings, vocab, model, slots, rows);
  }
  get k() {
    return this.model.k;
  }
  /** Number of documents. */
  get size() {
    return this._slotOf.size;
  }
  /** Document paths in slot order. */
  paths() {
    return this._slots.filter((s) => s !== null).map((s) => s.meta.path);
  }
  has(path) {
    return this._slotOf.has(path);
  }
  meta(path) {
    const s = this._slotOf.get(path);
    return s === void 0 ? void 0 : this._slots[s].meta;
  }
  /** Raw term counts of a document (ids of this.vocab). */
  termsOf(path) {
    return this._slots[this.slot(path)].terms;
  }
  /** The unit concept vector of a document (a view; do not modify). */
  vectorOf(path) {
    const s = this.slot(path);
    return this._rows.rows.subarray(s * this.k, (s + 1) * this.k);
  }
  /** Internal slots, including null holes left by removals (for persistence and bulk views). */
  slots() {
    return this._slots;
  }
  /** All slots' concept vectors, slots.length × k (holes are zero rows). */
  vectors() {
    return this._rows.rows.subarray(0, this._slots.length * this.k);
  }
  /**
   * Counts a query's terms against the vocabulary without growing it. Question filler words
   * (fusion.ts) are left out when known words remain without them.
   */
  queryTerms(text) {
    const tokens = tokenize(text, this.settings.tokenize);
    if (this.ranking.dropFiller) {
      this._filler ??= new Set(tokenize(QUESTION_FILLER.join(" "), this.settings.tokenize));
      const filler = this._filler;
      const kept = countTerms(
        tokenize(stripPointing(text), this.settings.tokenize).filter((t) => !filler.has(t)),
        this.vocab,
        false
      );
      if (kept.termIds.length > 0) return kept;
    }
    return countTerms(tokens, this.vocab, false);
  }
  /** Concept vector of free text (zeros if no model term occurs). */
  projectText(text) {
    return projectTerms(this.model, this.queryTerms(text)).vector;
  }
  /**
   * Ranks documents by meaning for plain-language text: the query's concept cosine (after
   * pseudo-relevance feedback, and moved towards files marked like / away from files marked
   * unlike) blended with max-normalised BM25 (fusion.ts). Files marked like or unlike are not
   * ranked. Throws NoKnownTermsError when neither the text nor a liked file gives known words.
   */
  search(text, options = {}) {
    const plan = this.searchPlan(text, options);
    const { lexical, accept } = plan;
    const lambda = plan.lambda;
    const { ranked, product } = this.rank(
      plan.vector,
      plan.known ? 1 - lambda : 0,
      lambda,
      lexical,
      options.top ?? 10,
      accept,
      this._scratch.subarray(this._slots.length, 2 * this._slots.length)
    );
    return ranked.map(({ slot, score }) => ({
      path: this._slots[slot].meta.path,
      score,
      conceptScore: product(slot),
      lexicalScore: lexical[slot]
    }));
  }
  /**
   * What a search ranks with: the text's terms, the lexical query (the text's terms and the liked
   * files' distinctive terms), the final concept query vector (after pseudo-relevance and user
   * feedback; `scale` is the factor the text's own unit vector carries in it), the BM25 scores
   * divided by their maximum (a view overwritten by the next search) and the slots that may rank.
   */
  searchPlan(text, options = {}) {
    const r = this.ranking;
    const q = this.queryTerms(text);
    const liked = (options.like ?? []).map((p) => this.slot(p));
    const unliked = (options.unlike ?? []).map((p) => this.slot(p));
    if (q.termIds.length === 0 && liked.length === 0) throw new NoKnownTermsError(text);
    let lexQuery = q;
    for (const s of liked) lexQuery = mergeTerms(lexQuery, this.fileQuery(s, r.likeWeight / liked.length));
    const proj = projectTerms(this.model, q);
    const n2 = this._slots.length;
    if (this._scratch.length < 2 * n2) this._scratch = new Float64Array(2 * Math.ceil(n2 * 1.25));
    const lexical = this._scratch.subarray(0, n2).fill(0);
    let lambda = this.settings.lexicalBlend;
    if (lambda > 0) {
      this.bm25().scoreInto(lexQuery, lexical);
      divideByMax(lexical);
      if (r.coverageBlend) lambda += (1 - lambda) * this.unknownShare(q);
    }
    const marked = /* @__PURE__ */ new Set([...liked, ...unliked]);
    const live = this.acceptor(options.filter);
    const accept = marked.size ? (j) => !marked.has(j) && live(j) : live;
    let vector = proj.vector;
    let scale = proj.knownTerms > 0 ? 1 : 0;
    let known = proj.knownTerms > 0;
    if (known && r.feedbackDocs > 0 && r.feedbackWeight > 0) {
      const first = this.rank(vector, 1 - lambda, lambda, lexical, r.feedbackDocs, accept, this._scratch.subarray(n2, 2 * n2));
      const moved = rocchio(vector, [{ weight: r.feedbackWeight, vectors: first.ranked.map(({ slot }) => this.slotVector(slot)) }]);
      if (moved) [vector, scale] = [moved.vector, scale * moved.scale];
    }
    if (liked.length > 0 || unliked.length > 0) {
      const moved = rocchio(vector, [
        { weight: r.likeWeight, vectors: liked.map((s) => this.slotVector(s)) },
        { weight: -r.unlikeWeight, vectors: unliked.map((s) => this.slotVector(s)) }
      ]);
      if (moved) [vector, scale, known] = [moved.vector, scale * moved.scale, true];
    }
    return { terms: q, lexicalQuery: lexQuery, vector, scale, known, lexical, accept, lambda };
  }
  /**
   * The files nearest in meaning to a file, itself excluded: the concept cosine blended with the
   * BM25 score of the file's most distinctive terms against the others, divided by the best
   * other file's (fusion.ts).
   */
  nearby(path, options = {}) {
    const self = this.slot(path);
    const live = this.acceptor(options.filter);
    const accept = (j) => j !== self && live(j);
    const n2 = this._slots.length;
    const mu = this.ranking.nearbyLexical;
    const { lexical } = this.nearbyPlan(path);
    const { ranked, product } = this.rank(
      this.vectorOf(path),
      1 - mu,
      mu,
      lexical,
      options.top ?? 10,
      accept,
      this._scratch.subarray(n2, 2 * n2)
    );
    return ranked.map(({ slot, score }) => ({
      path: this._slots[slot].meta.path,
      score,
      conceptScore: product(slot),
      lexicalScore: lexical[slot]
    }));
  }
  /**
   * Nearby's lexical evidence for a file: its lexical query (most distinctive terms), the best
   * BM25 score among the other files, and every file's score divided by it (itself 0; a view
   * overwritten by the next search). Without a lexical share (nearbyLexical = 0) all zeros.
   */
  nearbyPlan(path) {
    const self = this.slot(path);
    const n2 = this._slots.length;
    if (this._scratch.length < 2 * n2) this._scratch = new Float64Array(2 * Math.ceil(n2 * 1.25));
    const lexical = this._scratch.subarray(0, n2).fill(0);
    const lexicalQuery = this.fileQuery(self, 1);
    let max = 0;
    if (this.ranking.nearbyLexical > 0) {
      this.bm25().scoreInto(lexicalQuery, lexical);
      lexical[self] = 0;
      max = divideByMax(lexical);
    }
    return { lexicalQuery, max, lexical };
  }
  /** The idf-weighted share of a query's terms that the concept model does not know (0…1). */
  unknownShare(q) {
    const { columnOf } = this.model;
    let all = 0;
    let unknown = 0;
    for (let i = 0; i < q.termIds.length; i++) {
      const t = q.termIds[i];
      const w = q.counts[i] * this.bm25().idf(t);
      all += w;
      if (t >= columnOf.length || columnOf[t] < 0) unknown += w;
    }
    return all > 0 ? unknown / all : 0;
  }
  /** A file's lexical query: its most distinctive terms with their counts, times `weight`. */
  fileQuery(slot, weight) {
    const terms = distinctiveTerms(this._slots[slot].terms, this.ranking.nearbyTerms, (t) => this.bm25().idf(t));
    if (weight !== 1) for (let i = 0; i < terms.counts.length; i++) terms.counts[i] *= weight;
    return terms;
  }
  slotVector(slot) {
    return this._rows.rows.subarray(slot * this.k, (slot + 1) * this.k);
  }
  /**
   * Top N of a·(v_j·q) + b·lexical_j over accepted slots: screened with the 8-bit codes when they
   * are ready (the same ranking and scores as a full pass), else a full pass into `scratch`.
   */
  rank(q, a, b, lexical, top, accept, scratch) {
    const codes = this.codes();
    const n2 = this._slots.length;
    const screened = codes && a > 0 && screenedTop({ codes, rows: this._rows, q, n: n2, top, accept, a, ...b > 0 ? { extra: { b, values: lexical } } : {} }, this._screen);
    if (screened) return { ranked: screened.ranked, product: (slot) => screened.product(slot) };
    const concept = this.liveDots(q);
    blend(a, concept, b, lexical, scratch);
    const ranked = topN(scratch, top, accept);
    return { ranked, product: (slot) => concept[slot] };
  }
  /** Cosine of a unit concept vector with every slot (holes score −Infinity). */
  cosines(vector) {
    return this.liveDots(vector).slice();
  }
  /** Dot products with every slot, holes −Infinity: a view overwritten by the next call. */
  liveDots(vector) {
    const out = this._rows.dots(vector, this._slots.length);
    markHoles(this._slots, out);
    return out;
  }
  /**
   * Builds what searches need ahead of time (the 8-bit codes, then every term's BM25 postings),
   * pausing between slices of about sliceMs; resolves true when all is ready, false when aborted.
   * Cheap once done; later edits keep both up to date.
   */
  async prepare(options = {}) {
    const { sliceMs, signal, pause } = { ...DEFAULT_PREPARE_OPTIONS, ...options };
    for (; ; ) {
      if (signal?.aborted) return false;
      if (this.prepareSlice(sliceMs)) return true;
      await pause();
    }
  }
  /** One slice of prepare(): works about budgetMs (at least one chunk); true when all is ready. */
  prepareSlice(budgetMs) {
    const t02 = performance.now();
    const more = () => performance.now() - t02 < budgetMs;
    if (!this.fillCodes(more)) return false;
    return this.settings.lexicalBlend > 0 ? this.bm25().prepare(more) : true;
  }
  /** Codes the rows not coded yet while more() says so (at least one chunk); true when complete. */
  fillCodes(more) {
    if (this._codes === void 0) this._codes = ConceptCodes.empty(this.k, this._rows.capacity);
    return !this._codes || this._codes.fill(this._rows.rows, this._slots.length, more);
  }
  /** The 8-bit screening copy of the vectors, made on first use (null without WebAssembly or while prepare is filling it). */
  codes() {
    if (this._codes === void 0) this.fillCodes(() => true);
    return this._codes && this._codes.filled >= this._slots.length ? this._codes : null;
  }
  /** Whether a slot may be ranked: occupied, and its path passes the filter. */
  acceptor(filter) {
    const slots = this._slots;
    return filter ? (j) => slots[j] !== null && filter(slots[j].meta.path) : (j) => slots[j] !== null;
  }
  /**
   * Adds or replaces a document by folding it into the concept space with the frozen model.
   * New words join the vocabulary (and lexical search) but not the concept space until a rebuild.
   */
  foldIn(meta, text) {
    const tokens = tokenize(text, this.settings.tokenize);
    const before = this.vocab.size;
    const terms = countTerms(tokens, this.vocab, true);
    this._changes.folded(terms, before);
    const proj = projectTerms(this.model, terms);
    let s = this._slotOf.get(meta.path);
    if (s === void 0) {
      s = this._slots.length;
      this._slots.push(null);
      this._rows.ensureCapacity(this._slots.length);
      this._slotOf.set(meta.path, s);
    }
    this._slots[s] = { meta, terms, folded: true, residual: proj.residual };
    this._rows.setRow(s, proj.vector);
    this._codes?.ensureCapacity(this._slots.length);
    this._codes?.setRow(s, proj.vector);
    this._bm25?.setDocument(s, terms);
    this.sections.set(meta.path, foldSections(foldContextOf(this), meta.path, text));
    return terms;
  }
  /** Removes a document; returns false when it was not indexed. */
  remove(path) {
    const s = this._slotOf.get(path);
    if (s === void 0) return false;
    const wasFolded = this._slots[s].folded;
    this._slots[s] = null;
    this._rows.clearRow(s);
    this._codes?.clearRow(s);
    this._slotOf.delete(path);
    this.sections.delete(path);
    this._changes.removed(wasFolded);
    this._bm25?.setDocument(s, null);
    return true;
  }
  staleness() {
    return this._changes.measure(this._slots, this.size, this.model.residualMean);
  }
  /** Change counters since the last build (persisted with the index). */
  counters() {
    return this._changes.counters;
  }
  restoreCounters(c) {
    this._changes.restore(c);
  }
  /** The lexical scorer over all current documents (made on first use, then kept up to date). */
  bm25() {
    if (!this._bm25)
      this._bm25 = new Bm25Scorer(
        this._slots.map((s) => s?.terms ?? null),
        { b: this.ranking.lengthNorm }
      );
    return this._bm25;
  }
  slot(path) {
    const s = this._slotOf.get(path);
    if (s === void 0) throw new NotIndexedError(path);
    return s;
  }
};
function divideByMax(a) {
  let max = 0;
  for (let j = 0; j < a.length; j++) max = Math.max(max, a[j]);
  if (max > 0) for (let j = 0; j < a.length; j++) a[j] /= max;
  return max;
}
function blend(wa, a, wb, b, out) {
  for (let j = 0; j < out.length; j++) out[j] = wa * a[j] + wb * b[j];
}
function markHoles(slots, out) {
  for (let j = 0; j < slots.length; j++) if (slots[j] === null) out[j] = Number.NEGATIVE_INFINITY;
}

// src/core/index/model/settings.ts
var DEFAULT_INDEX_SETTINGS = Object.freeze({
  weighting: "log-entropy",
  k: "auto",
  seed: DEFAULT_SEED,
  powerIterations: 5,
  prune: DEFAULT_PRUNE_OPTIONS,
  tokenize: DEFAULT_TOKENIZE_OPTIONS,
  conceptScaling: 1,
  lexicalBlend: 0.5
});
function resolveSettings(partial = {}) {
  return {
    ...DEFAULT_INDEX_SETTINGS,
    ...partial,
    prune: { ...DEFAULT_INDEX_SETTINGS.prune, ...partial.prune ?? {} },
    tokenize: { ...DEFAULT_INDEX_SETTINGS.tokenize, ...partial.tokenize ?? {} }
  };
}

// src/core/index/model/indexBuilder.ts
var IndexBuilder = class {
  settings;
  _vocab;
  _docs = /* @__PURE__ */ new Map();
  /** Pass the vocabulary the given DocTerms refer to when reusing counts from an index. */
  constructor(settings = {}, vocab = new Vocabulary()) {
    this.settings = resolveSettings(settings);
    this._vocab = vocab;
  }
  get size() {
    return this._docs.size;
  }
  /** Tokenizes and counts one document (replacing an earlier one with the same path). */
  addText(meta, text) {
    const terms = countTerms(tokenize(text, this.settings.tokenize), this._vocab, true);
    this._docs.set(meta.path, { meta, terms });
    return terms;
  }
  /** Adds a document whose terms were counted against this builder's vocabulary. */
  addCounted(meta, terms) {
    this._docs.set(meta.path, { meta, terms });
  }
  remove(path) {
    return this._docs.delete(path);
  }
  build(progress = {}) {
    const paths = [...this._docs.keys()].sort(comparePaths);
    const used = new Uint8Array(this._vocab.size);
    for (const p of paths) for (const id of this._docs.get(p).terms.termIds) used[id] = 1;
    const oldIds = [];
    for (let id = 0; id < used.length; id++) if (used[id]) oldIds.push(id);
    const canonical = oldIds.length === this._vocab.size && inCodeUnitOrder(this._vocab);
    const terms = canonical ? [] : this._vocab.terms;
    if (!canonical) oldIds.sort((a, b) => terms[a] < terms[b] ? -1 : terms[a] > terms[b] ? 1 : 0);
    const newId = new Int32Array(canonical ? 0 : this._vocab.size).fill(-1);
    if (!canonical) oldIds.forEach((old, i) => newId[old] = i);
    const vocab = canonical ? this._vocab : new Vocabulary(oldIds.map((id) => terms[id]));
    const slots = paths.map((path) => {
      const { meta, terms: t } = this._docs.get(path);
      return { meta, terms: canonical ? t : remap2(t, newId), folded: false, residual: 0 };
    });
    if (slots.length === 0) throw new InvalidInputError("There are no files to index.");
    if (progress.sharedModel) {
      const a = adoptSharedModel(progress.sharedModel, vocab, slots, this.settings, progress);
      return LsiIndex.assemble(this.settings, a.vocab, a.model, a.slots, a.vectors);
    }
    const { model, vectors } = buildConceptModelAndVectors(
      slots.map((s) => s.terms),
      vocab.size,
      this.settings,
      progress
    );
    return LsiIndex.assemble(this.settings, vocab, model, slots, vectors);
  }
};
function inCodeUnitOrder(vocab) {
  if (vocab.byteOrdered > 0) {
    const { bytes, sorted } = vocab.toBytes();
    if (sorted === vocab.size && !hasFourByteSequence(bytes)) return true;
  }
  const terms = vocab.terms;
  for (let i = 1; i < terms.length; i++) if (!(terms[i - 1] < terms[i])) return false;
  return true;
}
function hasFourByteSequence(bytes) {
  const head = Math.min(bytes.length, (4 - bytes.byteOffset % 4) % 4);
  const words = new Uint32Array(bytes.buffer, bytes.byteOffset + head, bytes.length - head >>> 2);
  for (let i = 0; i < head; i++) if (bytes[i] >= 240) return true;
  for (let w = 0; w < words.length; w++) {
    if ((words[w] & 2155905152) === 0) continue;
    for (let i = head + 4 * w; i < head + 4 * w + 4; i++) if (bytes[i] >= 240) return true;
  }
  for (let i = head + 4 * words.length; i < bytes.length; i++) if (bytes[i] >= 240) return true;
  return false;
}
var REMAP_SHIFT = 2 ** 21;
function remap2(t, newId) {
  const n2 = t.termIds.length;
  const termIds = new Int32Array(n2);
  let sorted = true;
  for (let i = 0; i < n2; i++) {
    termIds[i] = newId[t.termIds[i]];
    if (i > 0 && termIds[i] < termIds[i - 1]) sorted = false;
  }
  if (sorted) return { termIds, counts: Float32Array.from(t.counts), length: t.length };
  if (n2 >= REMAP_SHIFT) {
    const order = Array.from({ length: n2 }, (_, i) => i).sort((a, b) => termIds[a] - termIds[b]);
    return { termIds: Int32Array.from(order, (i) => termIds[i]), counts: Float32Array.from(order, (i) => t.counts[i]), length: t.length };
  }
  const keys = new Float64Array(n2);
  for (let i = 0; i < n2; i++) keys[i] = termIds[i] * REMAP_SHIFT + i;
  keys.sort();
  const counts = new Float32Array(n2);
  for (let j = 0; j < n2; j++) {
    const id = Math.floor(keys[j] / REMAP_SHIFT);
    termIds[j] = id;
    counts[j] = t.counts[keys[j] - id * REMAP_SHIFT];
  }
  return {
    termIds,
    counts,
    length: t.length
  };
}
function comparePaths(a, b) {
  return a < b ? -1 : a > b ? 1 : 0;
}

// test/helpers/shared.ts
import { existsSync, readFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
var REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..", "..");
var FIXTURES_DIR = resolve(REPO_ROOT, "test", "fixtures");
var FixtureMissingError = class extends Error {
  constructor(rel) {
    super(`test/fixtures/${rel} is missing from the checkout (see test/fixtures/*/README.md for how it is made)`);
    this.name = "FixtureMissingError";
  }
};
function fixturePath(rel) {
  const p = join(FIXTURES_DIR, rel);
  if (!existsSync(p)) throw new FixtureMissingError(rel);
  return p;
}

// test/helpers/rankingChecks.ts
function lines(dir, name) {
  const p = join2(dir, name);
  const text = existsSync2(p) ? readFileSync2(p, "utf8") : gunzipSync(readFileSync2(`${p}.gz`)).toString("utf8");
  return text.split("\n").filter((l) => l.trim().length > 0);
}
function loadRankingFixture(name) {
  const dir = fixturePath(name);
  const qrels = /* @__PURE__ */ new Map();
  for (const line of lines(dir, "qrels.tsv")) {
    const [q, d, rel] = line.split("	");
    if (!q || !d || !(Number(rel) > 0)) continue;
    if (!qrels.has(q)) qrels.set(q, /* @__PURE__ */ new Set());
    qrels.get(q).add(d);
  }
  const baselinePath = join2(dir, "baselines.json");
  return {
    docs: lines(dir, "docs.jsonl").map((l) => JSON.parse(l)),
    queries: lines(dir, "queries.jsonl").map((l) => JSON.parse(l)),
    qrels,
    baselines: existsSync2(baselinePath) ? JSON.parse(readFileSync2(baselinePath, "utf8")) : null
  };
}
function buildFixtureIndex(fixture, settings = {}) {
  const builder = new IndexBuilder(settings);
  for (const d of fixture.docs) builder.addText({ path: d.id, size: d.text.length, mtimeMs: 0 }, d.text);
  return builder.build();
}

// src/core/sections/sectionSearch.ts
var DEFAULT_SECTION_SEARCH = { top: 10, perFile: 3 };
var slotCache = /* @__PURE__ */ new WeakMap();
function slotsOf(index2) {
  const slots = index2.slots();
  const hit = slotCache.get(index2);
  if (hit && hit.length === slots.length && hit.map.size === index2.size) return hit.map;
  const map = /* @__PURE__ */ new Map();
  slots.forEach((s, i) => s && map.set(s.meta.path, i));
  slotCache.set(index2, { length: slots.length, map });
  return map;
}
function searchSections(index2, text, options = {}) {
  const { top, perFile } = { ...DEFAULT_SECTION_SEARCH, ...options };
  const plan = index2.searchPlan(text, options);
  const a = plan.known ? 1 - plan.lambda : 0;
  const slot = slotsOf(index2);
  const accept = (path) => plan.accept(slot.get(path) ?? -1);
  const pool = index2.sections.rank(plan.vector, Math.max(top * 8, 64), accept, perFile);
  return pool.map((h) => ({ ...h, score: a * h.score + plan.lambda * plan.lexical[slot.get(h.path)] })).sort((x, y) => y.score - x.score).slice(0, top);
}
function scoreFilesWithSections(index2, text, sectionShare, paths) {
  const plan = index2.searchPlan(text);
  const a = plan.known ? 1 - plan.lambda : 0;
  const slot = slotsOf(index2);
  const out = /* @__PURE__ */ new Map();
  for (const path of paths ?? index2.paths()) {
    const j = slot.get(path);
    if (j === void 0 || !plan.accept(j)) continue;
    const v = index2.vectorOf(path);
    let cos = 0;
    for (let c = 0; c < v.length; c++) cos += v[c] * plan.vector[c];
    const best = index2.sections.best(path, plan.vector);
    const concept = best ? (1 - sectionShare) * cos + sectionShare * best.score : cos;
    out.set(path, { score: a * concept + plan.lambda * plan.lexical[j], best });
  }
  return out;
}

// ../../../tmp/i15/evalCode.ts
var fx = loadRankingFixture("rxjs-src");
var t0 = Date.now();
var index = buildFixtureIndex(fx);
var ctx = foldContextOf(index);
for (const d of fx.docs) index.sections.set(d.id, foldSections(ctx, d.id, d.text));
console.log("k", index.k, "files", index.size, "sections", index.sections.count, "ms", Date.now() - t0);
var lines2 = new Map(readFileSync3("/work/wt/i15/test/fixtures/rxjs-src/targetLines.tsv", "utf8").trim().split("\n").map((l) => {
  const [q, p, n2] = l.split("	");
  return [q, { p, n: Number(n2) }];
}));
var gammas = [0, 0.25, 0.5, 0.75, 1];
var mrr = new Array(gammas.length).fill(0);
var secMrr = 0;
var secMrr10 = 0;
var n = 0;
for (const q of fx.queries) {
  const t = lines2.get(q.id);
  n++;
  try {
    index.searchPlan(q.text);
  } catch {
    continue;
  }
  gammas.forEach((g, gi) => {
    const s = scoreFilesWithSections(index, q.text, g);
    const mine = s.get(t.p).score;
    let rank = 1;
    for (const [p, v] of s) if (p !== t.p && v.score > mine) rank++;
    if (rank <= 10) mrr[gi] += 1 / rank;
  });
  const hits = searchSections(index, q.text, { top: 1e4, perFile: 1e3 });
  const r = hits.findIndex((h) => h.path === t.p && h.start <= t.n && t.n < h.end);
  if (r >= 0) {
    secMrr += 1 / (r + 1);
    if (r < 10) secMrr10 += 1 / (r + 1);
  }
}
console.log("file MRR@10 by gamma", gammas.map((g, i) => `${g}:${(mrr[i] / n).toFixed(4)}`).join(" "));
console.log("section MRR", (secMrr / n).toFixed(4), "MRR@10", (secMrr10 / n).toFixed(4));
