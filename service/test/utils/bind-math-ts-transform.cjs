/** ts-jest with Math bound once per module: see bind-math-transform.cjs. */
module.exports = require('./bind-math-transform.cjs').typescript;
