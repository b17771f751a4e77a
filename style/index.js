import './base.css';
import './landau.css';
